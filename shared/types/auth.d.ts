import type { Role } from './roles'

declare module '#auth-utils' {
  interface User {
    id: number
    shopId: number
    name: string
    email: string
    role: Role
    /** The person's chosen language; null until they choose (the browser decides). */
    language?: string | null
  }
}

export {}
