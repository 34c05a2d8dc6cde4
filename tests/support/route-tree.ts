/**
 * The API routes as the file tree declares them: every file under server/api becomes
 * one `METHOD /api/path` key, written the way Nitro names it (`[id]`, `[...slug]`).
 * The access matrix and the fuzz tests read this, so a new route file cannot slip past them.
 */
import { readdirSync, statSync } from 'node:fs'
import { join, relative, sep } from 'node:path'

export const HTTP_METHODS = ['get', 'post', 'put', 'patch', 'delete', 'head', 'options'] as const
export type HttpMethod = Uppercase<(typeof HTTP_METHODS)[number]> | 'ANY'

export interface DeclaredRoute {
  /** `POST /api/tanks/[id]/readings` */
  key: string
  method: HttpMethod
  /** `/api/tanks/[id]/readings` */
  pattern: string
  file: string
}

function walk(dir: string): string[] {
  return readdirSync(dir).flatMap((name) => {
    const path = join(dir, name)
    return statSync(path).isDirectory() ? walk(path) : [path]
  })
}

/** Parses one route file name relative to server/api, e.g. `tanks/[id].patch.ts`. */
export function routeFromFile(file: string): Omit<DeclaredRoute, 'file'> | null {
  const match = /^(.*?)(?:\.(get|post|put|patch|delete|head|options))?\.(ts|js|mjs)$/.exec(file.split(sep).join('/'))
  if (!match) return null
  const [, stem = '', method] = match
  const segments = stem.split('/').filter(segment => segment !== 'index')
  const pattern = ['/api', ...segments].join('/').replace(/\/$/, '') || '/api'
  const upper = (method ? method.toUpperCase() : 'ANY') as HttpMethod
  return { key: `${upper} ${pattern}`, method: upper, pattern }
}

/** Every route under server/api, sorted by key. */
export function declaredRoutes(root = process.cwd()): DeclaredRoute[] {
  const apiDir = join(root, 'server/api')
  return walk(apiDir)
    .map((path) => {
      const file = relative(apiDir, path)
      const route = routeFromFile(file)
      return route ? { ...route, file: `server/api/${file.split(sep).join('/')}` } : null
    })
    .filter((route): route is DeclaredRoute => route !== null)
    .sort((a, b) => a.key.localeCompare(b.key))
}
