import { readdirSync, statSync } from 'node:fs'
import { join, relative } from 'node:path'

export const API_DIR = join(process.cwd(), 'server/api')

/** Every route under server/api as `METHOD /api/path/[param]`, found by Nitro's file naming. */
export function discoverRoutes(dir = API_DIR): string[] {
  return discoverRouteFiles(dir).map(r => r.key).sort()
}

/** The same routes with the file each comes from (to see what a handler reads). */
export function discoverRouteFiles(dir = API_DIR): { key: string, method: string, path: string, file: string }[] {
  const out: { key: string, method: string, path: string, file: string }[] = []
  for (const name of readdirSync(dir)) {
    const full = join(dir, name)
    if (statSync(full).isDirectory()) { out.push(...discoverRouteFiles(full)); continue }
    const m = name.match(/^(.*)\.(get|post|patch|put|delete)\.ts$/)
    if (!m) continue
    const route = relative(API_DIR, join(dir, m[1] === 'index' ? '' : m[1]!)).split('\\').join('/')
    const method = m[2]!.toUpperCase()
    const path = `/api${route ? `/${route}` : ''}`
    out.push({ key: `${method} ${path}`, method, path, file: full })
  }
  return out.sort((a, b) => a.key.localeCompare(b.key))
}
