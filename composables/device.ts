import { STORAGE_KEY_DEVICE } from '~/constants'

/** A stable id for this tablet, kept in localStorage and sent with every event it makes. */
export function useDeviceId(): string {
  if (import.meta.server) return 'server'
  let id = localStorage.getItem(STORAGE_KEY_DEVICE)
  if (!id) {
    id = `tablet-${crypto.randomUUID()}`
    localStorage.setItem(STORAGE_KEY_DEVICE, id)
  }
  return id
}
