import { resolve } from 'node:path'
import { beforeAll, describe, expect, it } from 'vitest'
import { ESLint } from 'eslint'

/**
 * The lint gates of eslint.config.mjs can fail: small sources, linted in memory as if they were
 * files of the project, get the error each gate is for, and their correct twins do not.
 */
const ROOT = resolve(import.meta.dirname, '../..')
let eslint: ESLint

beforeAll(() => {
  eslint = new ESLint({ cwd: ROOT })
})

/** Lints `code` as the file `path` (relative to the repository root; the file need not exist). */
async function lint(path: string, code: string) {
  const [result] = await eslint.lintText(code, { filePath: resolve(ROOT, path) })
  expect(result, `${path} was linted`).toBeDefined()
  const fatal = result!.messages.filter(m => m.fatal)
  expect(fatal, `${path} parses`).toEqual([])
  return result!.messages
}
const errorsOf = (messages: Awaited<ReturnType<typeof lint>>, rule: string) => messages.filter(m => m.ruleId === rule && m.severity === 2)

const PAGE_WITH = (tag: string) => `<script setup lang="ts">
useHead({ title: 'Probe · Larmoir' })
</script>

<template>
  <AuthCard title="Probe" lead="A page for the lint gate.">
    <${tag} endpoint="/api/auth/invitation" submit-label="Set my password" />
  </AuthCard>
</template>
`

describe('the lint gates', () => {
  it('an unregistered component in a page is an error; the registered one is not', async () => {
    const unregistered = errorsOf(await lint('pages/lint-probe.vue', PAGE_WITH('PasswordFromLinkForm')), 'vue/no-undef-components')
    expect(unregistered.map(m => m.message).join('\n')).toMatch(/PasswordFromLinkForm/)

    const registered = await lint('pages/lint-probe.vue', PAGE_WITH('AuthPasswordFromLinkForm'))
    expect(errorsOf(registered, 'vue/no-undef-components')).toEqual([])
    expect(registered.filter(m => m.severity === 2), 'the correct page passes every rule').toEqual([])
  }, 60_000)

  it('client code importing from server/ is an error; importing from shared/ is not', async () => {
    const fromServer = await lint('composables/useLintProbe.ts', `import { computePours } from '~~/server/utils/flights'

export const useLintProbe = () => computePours
`)
    expect(errorsOf(fromServer, 'no-restricted-imports')).toHaveLength(1)

    const fromShared = await lint('composables/useLintProbe.ts', `import { ROLE_LABELS } from '#shared/roles'

export const useLintProbe = () => ROLE_LABELS
`)
    expect(errorsOf(fromShared, 'no-restricted-imports')).toEqual([])
  }, 60_000)

  it('shared/ importing from server/ is an error; importing another shared/ file is not', async () => {
    const fromServer = await lint('shared/lint-probe.ts', `import { useDb } from '../server/utils/db'

export const probe = () => useDb
`)
    expect(errorsOf(fromServer, 'no-restricted-imports')).toHaveLength(1)

    const fromShared = await lint('shared/lint-probe.ts', `import { ROLE_LABELS } from './roles'

export const probe = () => ROLE_LABELS
`)
    expect(errorsOf(fromShared, 'no-restricted-imports')).toEqual([])
  }, 60_000)
})
