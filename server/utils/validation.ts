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

export function notFound(what = 'Not found'): never {
  throw createError({ statusCode: 404, statusMessage: 'Not Found', message: what })
}

/** MariaDB duplicate key, raised by a unique index. */
export function isDuplicateEntry(error: unknown): boolean {
  return typeof error === 'object' && error !== null && (error as { code?: string }).code === 'ER_DUP_ENTRY'
}
