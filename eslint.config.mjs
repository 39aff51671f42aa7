// @ts-check
// Lint gates of the project (DEVELOPERS.md, "Gates"): Nuxt's own config with the house style, plus
// the rules that keep the one-way contract client → shared ← server and catch a component name
// that nothing registers. Unused exports are knip's job (knip.json), run by `npm run lint` too.
import { readFileSync } from 'node:fs'
import withNuxt from './.nuxt/eslint.config.mjs'

// eslint-flat-config-utils 3.1+ calls Object.groupBy, which Node.js has from 21 on; this machine
// runs Node.js 20.20, so the same function is supplied here (same semantics, Map-free form).
if (!Object.groupBy) {
  Object.defineProperty(Object, 'groupBy', {
    configurable: true,
    writable: true,
    /** @param {Iterable<unknown>} items @param {(item: unknown, index: number) => PropertyKey} key */
    value: (items, key) => {
      /** @type {Record<PropertyKey, unknown[]>} */
      const out = Object.create(null)
      let i = 0
      for (const item of items) (out[key(item, i++)] ??= []).push(item)
      return out
    },
  })
}

/**
 * Every component Nuxt registers (auto-imported components, Lazy variants, Nuxt's and modules'
 * own), read from the declarations `nuxt prepare` writes. A tag in a template that is not one of
 * these, not imported in the file and not an HTML or Vue element is an unresolved component.
 */
function registeredComponents() {
  const dts = readFileSync(new URL('./.nuxt/components.d.ts', import.meta.url), 'utf8')
  return [...new Set([...dts.matchAll(/^export const (\w+):/gm)].map(m => String(m[1])))]
}
/** @param {string} name */
const kebab = name => name.replace(/([a-z0-9])([A-Z])/g, '$1-$2').toLowerCase()
const componentPatterns = registeredComponents().flatMap(n => [`^${n}$`, `^${kebab(n)}$`])

const CLIENT = ['pages/**', 'components/**', 'composables/**', 'stores/**', 'layouts/**', 'middleware/**', 'plugins/**', 'utils/**', 'app.vue', 'error.vue']

export default withNuxt(
  {
    files: ['**/*.vue'],
    rules: {
      'vue/no-undef-components': ['error', { ignorePatterns: componentPatterns }],
      // Templates stay compact, as they are written: several attributes on a line, short
      // elements on one line.
      'vue/max-attributes-per-line': 'off',
      'vue/singleline-html-element-content-newline': 'off',
      // Form sections receive the form's reactive values object and bind inputs to its fields;
      // replacing the prop itself stays forbidden.
      'vue/no-mutating-props': ['error', { shallowOnly: true }],
      // The pages' content security policy runs no inline script, so an onclick="…" attribute
      // silently does nothing: bind handlers with @click instead.
      'vue/no-restricted-static-attribute': ['error', { key: '/^on[a-z]+$/i', message: 'Inline event handlers are blocked by the content security policy: use @event="…".' }],
    },
  },
  {
    // Short guard lines (`if (x) return; y()`, `try { a() } catch {}`) read better on one line;
    // three statements is the most one line may hold.
    rules: { '@stylistic/max-statements-per-line': ['error', { max: 3 }] },
  },
  {
    // Tests and benchmarks read loosely typed JSON from HTTP answers and delete fields to build bad input.
    files: ['tests/**', 'bench/**', 'scripts/**'],
    rules: { '@typescript-eslint/no-explicit-any': 'off', '@typescript-eslint/no-dynamic-delete': 'off' },
  },
  {
    // The client reads what the server sends through shared/ types; it never imports server code.
    files: CLIENT,
    rules: {
      'no-restricted-imports': ['error', {
        patterns: [{
          regex: '(^~~?/server(/|$))|(^#server)|((^|/)server/)',
          message: 'Client code may not import from server/: put the type or rule in shared/ (DEVELOPERS.md, "The contract").',
        }],
      }],
    },
  },
  {
    // shared/ is read by both sides, so it imports neither: no server, no client, no framework.
    files: ['shared/**'],
    rules: {
      'no-restricted-imports': ['error', {
        patterns: [{
          regex: '(^~~?/)|(^#(?!shared))|((^|/)(server|pages|components|composables|stores|layouts|middleware)/)|(^(vue|nuxt|h3|nitropack|drizzle-orm|mysql2|pinia)(/|$))',
          message: 'shared/ is the contract between client and server: it may import only shared/ files and plain libraries (DEVELOPERS.md, "The contract").',
        }],
      }],
    },
  },
  {
    // Nuxt's config ignores every folder named public (the static files); the guest components in
    // components/public are code and are linted like the rest.
    ignores: ['server/db/migrations/**', 'public/**', 'content/**', 'docs/**', '.data/**', 'test-results/**', '!**/components/public'],
  },
)
