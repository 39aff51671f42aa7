import { readdirSync } from 'node:fs'
import { join, relative, resolve } from 'node:path'

/** `server/api/flights/[id]/publish.post.ts` → `POST /api/flights/[id]/publish`. */
export function routeOfFile(root: string, file: string): string {
  const rel = relative(root, file).replace(/\\/g, '/')
  const m = /^(.*?)\.(get|post|put|patch|delete)\.ts$/.exec(rel)
  if (!m) throw new Error(`route file without a method: ${rel}`)
  return `${m[2]!.toUpperCase()} /${m[1]!.replace(/(^|\/)index$/, '')}`
}

function filesUnder(dir: string): string[] {
  return readdirSync(dir, { withFileTypes: true }).flatMap(d => (d.isDirectory() ? filesUnder(join(dir, d.name)) : [join(dir, d.name)]))
}

/** Every route the server has, read from its folders: `server/api/**` and `server/routes/**`. */
export function routeFiles(): string[] {
  const server = resolve(import.meta.dirname, '../../server')
  return [
    ...filesUnder(join(server, 'api')).map(f => routeOfFile(server, f)),
    ...filesUnder(join(server, 'routes')).map(f => routeOfFile(join(server, 'routes'), f)),
  ].sort()
}
