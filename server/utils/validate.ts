import type { H3Event } from 'h3'
import type { z } from 'zod'
import { describeIssues } from '#shared/validation/describe'

/**
 * Runs a zod schema; a failure is a 400 whose message names each bad field and whose
 * data carries the issues, so the client can put each message next to its input.
 * (h3's readValidatedBody would wrap this error and bury the issues one level down.)
 */
function validate<T extends z.ZodType>(schema: T, input: unknown, where: string): z.infer<T> {
  const result = schema.safeParse(input)
  if (result.success) return result.data
  throw createError({
    statusCode: 400,
    statusMessage: 'Bad Request',
    message: `${where}: ${describeIssues(result.error.issues)}`,
    data: { issues: result.error.issues.map(i => ({ path: i.path.map(String), message: i.message })) },
  })
}

export async function readValid<T extends z.ZodType>(event: H3Event, schema: T) {
  return validate(schema, await readJsonBody(event), 'Invalid body')
}

export function queryValid<T extends z.ZodType>(event: H3Event, schema: T) {
  return validate(schema, getQuery(event), 'Invalid query')
}

/** Any other input, e.g. the text fields of a multipart form. */
export function inputValid<T extends z.ZodType>(schema: T, input: unknown, where = 'Invalid form') {
  return validate(schema, input, where)
}

export function paramsValid<T extends z.ZodType>(event: H3Event, schema: T) {
  return validate(schema, getRouterParams(event, { decode: true }), 'Invalid route parameter')
}

/** A 400 naming one body field, shaped like the validation errors (data.issues) for the client. */
export function fieldError(field: string, message: string) {
  return createError({
    statusCode: 400,
    statusMessage: 'Bad Request',
    message: `${field}: ${message}`,
    data: { issues: [{ path: field.split('.'), message }] },
  })
}
