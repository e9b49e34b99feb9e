import type { H3Event } from 'h3'
import type { z } from 'zod'

/** One problem with a request, named by where it is ("body.tracks.0.blocks.1.sets"). */
export interface FieldIssue {
  path: string
  message: string
}

/** Turns zod issues into the `{ path, message }` list every 400 answer carries. */
export function toFieldIssues(error: z.ZodError, root: string): FieldIssue[] {
  return error.issues.flatMap((issue) => {
    // One issue per unknown field, named by its own path, so the message says which field is extra.
    if (issue.code === 'unrecognized_keys') {
      return issue.keys.map(key => ({
        path: [root, ...issue.path.map(String), key].join('.'),
        message: 'This field is not part of the request; leave it out.',
      }))
    }
    return [{ path: [root, ...issue.path.map(String)].join('.'), message: issue.message }]
  })
}

/** A 400 whose body lists every problem by path, in plain words. */
export function badRequest(issues: FieldIssue[], message = 'Some of what was sent is not valid.') {
  return createError({
    status: 400,
    message: `${message} ${issues.slice(0, 3).map(i => `${i.path}: ${i.message}`).join('; ')}`.trim(),
    data: { issues },
  })
}

/** Parses `value` with `schema` or throws a 400 listing every problem under `root`. */
export function parseOr400<S extends z.ZodType>(schema: S, value: unknown, root: string): z.output<S> {
  const result = schema.safeParse(value)
  if (!result.success) throw badRequest(toFieldIssues(result.error, root))
  return result.data
}

/** Reads the JSON body as it is; a body that is not JSON at all is a 400. */
export async function readJsonBody(event: H3Event): Promise<unknown> {
  try {
    return await readBody(event)
  }
  catch {
    throw badRequest([{ path: 'body', message: 'The body is not valid JSON.' }])
  }
}

/** Reads and validates the JSON body; a body that is not JSON at all is a 400 too. */
export async function readBodyWith<S extends z.ZodType>(event: H3Event, schema: S): Promise<z.output<S>> {
  return parseOr400(schema, (await readJsonBody(event)) ?? {}, 'body')
}

/** Validates the query string. */
export function queryWith<S extends z.ZodType>(event: H3Event, schema: S): z.output<S> {
  return parseOr400(schema, getQuery(event), 'query')
}

/** Validates route params. */
export function paramsWith<S extends z.ZodType>(event: H3Event, schema: S): z.output<S> {
  return parseOr400(schema, getRouterParams(event, { decode: true }), 'params')
}
