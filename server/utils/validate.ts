import type { H3Event } from 'h3'
import type { z } from 'zod'
import { fieldErrorsFromZod } from '../../shared/utils/fieldErrors'

function invalid(error: z.ZodError): never {
  const fields = fieldErrorsFromZod(error)
  invalidFields(fields)
}

async function parseWith<S extends z.ZodType>(schema: S, value: unknown): Promise<z.output<S>> {
  const result = await schema.safeParseAsync(value)
  if (!result.success) invalid(result.error)
  return result.data
}

/**
 * Characters no text of ours may hold: NUL and other C0 controls (tab and line breaks are fine),
 * the bidirectional overrides and isolates that make text read differently from how it is stored
 * (Unicode TR #9; CVE-2021-42574), and lone surrogates, which are not text at all and which MariaDB's
 * utf8mb4 cannot store.
 */
// eslint-disable-next-line no-control-regex -- these control characters are exactly what the pattern refuses
const FORBIDDEN_TEXT = /[\u0000-\u0008\u000B\u000C\u000E-\u001F\u202A-\u202E\u2066-\u2069]|[\uD800-\uDBFF](?![\uDC00-\uDFFF])|(?<![\uD800-\uDBFF])[\uDC00-\uDFFF]/
const TEXT_MESSAGE = 'Remove the control or text-direction characters from this text.'

/**
 * The path of the first string in `value` that holds a forbidden character, or null. Walked with a
 * stack of its own, not by recursion, so no depth of nesting can exhaust the call stack.
 */
function forbiddenTextAt(value: unknown): string | null {
  const stack: Array<[unknown, string[]]> = [[value, []]]
  while (stack.length) {
    const [v, path] = stack.pop()!
    if (typeof v === 'string') {
      if (FORBIDDEN_TEXT.test(v)) return path.join('.') || '_'
    }
    else if (v && typeof v === 'object') {
      const entries = Object.entries(v)
      for (let i = entries.length - 1; i >= 0; i--) stack.push([entries[i]![1], [...path, entries[i]![0]]])
    }
  }
  return null
}

function refuseForbiddenText(value: unknown): void {
  const at = forbiddenTextAt(value)
  if (at) invalidFields({ [at]: TEXT_MESSAGE })
}

const notJson = (): never => invalidFields({ _: 'The request body is not valid JSON.' })

/**
 * Reads and validates the JSON body. Over the route's size limit → 413; nested deeper than
 * JSON_MAX_DEPTH, malformed JSON, forbidden characters and failed checks → 400 per field.
 */
export async function readBodyAs<S extends z.ZodType>(event: H3Event, schema: S): Promise<z.output<S>> {
  const raw = await readRawBody(event, 'utf8')
  if (raw && Buffer.byteLength(raw) > bodyLimitFor(event.path)) bodyTooLarge(event)
  let body: unknown = {}
  if (raw && raw.trim()) {
    if (jsonDepth(raw, JSON_MAX_DEPTH) > JSON_MAX_DEPTH) invalidFields({ _: `The request nests lists and objects more than ${JSON_MAX_DEPTH} levels deep; no form here sends that.` })
    try { body = JSON.parse(raw) }
    catch { notJson() }
  }
  refuseForbiddenText(body)
  return parseWith(schema, body ?? {})
}

/** Query values come once each: `?copies=2&copies=3` (an array) is refused, not coerced. */
export function readQueryAs<S extends z.ZodType>(event: H3Event, schema: S): Promise<z.output<S>> {
  const query = getQuery(event)
  const repeated = Object.entries(query).filter(([, value]) => Array.isArray(value))
  if (repeated.length) invalidFields(Object.fromEntries(repeated.map(([key]) => [key, `Give ${key} once; it came ${(query[key] as unknown[]).length} times.`])))
  refuseForbiddenText(query)
  return parseWith(schema, query)
}

export function readParamsAs<S extends z.ZodType>(event: H3Event, schema: S): Promise<z.output<S>> {
  const params = getRouterParams(event, { decode: true })
  refuseForbiddenText(params)
  return parseWith(schema, params)
}
