import type { H3Event } from 'h3'
import type { z } from 'zod'
import { fieldErrorsFromZod } from '../../shared/utils/fieldErrors'

function invalid(error: z.ZodError): never {
  const fields = fieldErrorsFromZod(error)
  throw createError({
    statusCode: 400,
    statusMessage: 'Invalid input',
    message: Object.values(fields).join(' '),
    data: { fields },
  })
}

async function parseWith<S extends z.ZodType>(schema: S, value: unknown): Promise<z.output<S>> {
  const result = await schema.safeParseAsync(value)
  if (!result.success) invalid(result.error)
  return result.data
}

/** Reads and validates the JSON body; malformed JSON and failed checks both answer 400 per field. */
export async function readBodyAs<S extends z.ZodType>(event: H3Event, schema: S): Promise<z.output<S>> {
  let body: unknown
  try { body = await readBody(event) }
  catch { throw createError({ statusCode: 400, statusMessage: 'Invalid input', message: 'The request body is not valid JSON.', data: { fields: { _: 'The request body is not valid JSON.' } } }) }
  return parseWith(schema, body ?? {})
}

export function readQueryAs<S extends z.ZodType>(event: H3Event, schema: S): Promise<z.output<S>> {
  return parseWith(schema, getQuery(event))
}

export function readParamsAs<S extends z.ZodType>(event: H3Event, schema: S): Promise<z.output<S>> {
  return parseWith(schema, getRouterParams(event, { decode: true }))
}
