import type { ZodType } from 'zod'
import type { FieldIssue } from '#shared/types/users'

/** h3 wraps whatever a validator throws as `data` of a 400; toJSON decides what the client sees. */
class InvalidInput extends Error {
  constructor(readonly issues: FieldIssue[]) {
    super(issues.map(i => `${i.path}: ${i.message}`).join('; '))
  }

  toJSON() { return { issues: this.issues } }
}

/**
 * Turns a zod schema into the parser h3's getValidated* / readValidatedBody expect;
 * a failure is a 400 listing every field's problem in the one shape the interface reads.
 */
export function zodParser<T>(schema: ZodType<T>) {
  return (input: unknown): T => {
    const result = schema.safeParse(input)
    if (result.success) return result.data
    throw new InvalidInput(result.error.issues.map(i => ({ path: i.path.join('.') || '(body)', message: i.message })))
  }
}

/**
 * zodParser for a batch of files ("files.2.setupId"): each problem of a file starts with
 * that file's name, so the message says which file, not only which place in the list.
 */
export function batchParser<T>(schema: ZodType<T>, listKey: string, namesOf: (input: unknown) => (string | undefined)[] | Promise<(string | undefined)[]>) {
  return async (input: unknown): Promise<T> => {
    const result = schema.safeParse(input)
    if (result.success) return result.data
    const names = await namesOf(input)
    throw new InvalidInput(result.error.issues.map((i) => {
      const name = i.path[0] === listKey && typeof i.path[1] === 'number' ? names[i.path[1]] : undefined
      return { path: i.path.join('.') || '(body)', message: name ? `${name}: ${i.message}` : i.message }
    }))
  }
}

export function notFound(what = 'Not found'): never {
  throw createError({ statusCode: 404, statusMessage: 'Not Found', message: what })
}

/** MariaDB duplicate key, raised by a unique index. */
export function isDuplicateEntry(error: unknown): boolean {
  return typeof error === 'object' && error !== null && (error as { code?: string }).code === 'ER_DUP_ENTRY'
}

/** The array under `key` of a body not yet validated ([] when it is not one). */
export function listOf(input: unknown, key: string): unknown[] {
  const list = typeof input === 'object' && input !== null ? (input as Record<string, unknown>)[key] : undefined
  return Array.isArray(list) ? list : []
}

/** A string field of an item not yet validated, for messages only. */
export function nameOf(item: unknown, key: string): string | undefined {
  const value = typeof item === 'object' && item !== null ? (item as Record<string, unknown>)[key] : undefined
  return typeof value === 'string' && value.trim() ? value.trim().slice(0, 255) : undefined
}
