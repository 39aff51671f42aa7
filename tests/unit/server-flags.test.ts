import { readFileSync } from 'node:fs'
import { resolve } from 'node:path'
import { describe, expect, it } from 'vitest'
import { SERVER_MALLOC_ENV, SERVER_NODE_FLAGS } from '../../scripts/lib/app'

/** The README's production command starts the server as the project's own scripts do. */
describe('the server\'s start command', () => {
  const readme = readFileSync(resolve(import.meta.dirname, '../../README.md'), 'utf8')
  const command = /`([^`]*node [^`]*\.output\/server\/index\.mjs)`/.exec(readme)?.[1] ?? ''

  it('the README names one command that runs the built server', () => {
    expect(command).not.toBe('')
  })

  it('passes the same heap flags and malloc setting as scripts/lib/app.ts', () => {
    for (const flag of SERVER_NODE_FLAGS) expect(command.split(/\s+/)).toContain(flag)
    for (const [name, value] of Object.entries(SERVER_MALLOC_ENV)) expect(command).toContain(`${name}=${value}`)
    const inReadme = command.split(/\s+/).filter(w => w.startsWith('--'))
    expect(inReadme.sort()).toEqual([...SERVER_NODE_FLAGS].sort())
  })
})
