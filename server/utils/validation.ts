import type { ZodType } from 'zod'
import type { FieldIssue } from '#shared/types/users'

/**
 * Turns a zod schema into the parser h3's getValidated* helpers expect; failures
 * become 400 with every field's problem, in the one shape the interface reads.
 */
export function zodParser<T>(schema: ZodType<T>) {
  return (input: unknown): T => {
    const result = schema.safeParse(input)
    if (result.success) return result.data
    const issues: FieldIssue[] = result.error.issues.map(i => ({ path: i.path.join('.') || '(body)', message: i.message }))
    throw createError({
      statusCode: 400,
      statusMessage: 'Invalid input',
      message: issues.map(i => `${i.path}: ${i.message}`).join('; '),
      data: { issues },
    })
  }
}

export function notFound(what = 'Not found'): never {
  throw createError({ statusCode: 404, statusMessage: 'Not Found', message: what })
}

/** MariaDB duplicate key, raised by a unique index. */
export function isDuplicateEntry(error: unknown): boolean {
  return typeof error === 'object' && error !== null && (error as { code?: string }).code === 'ER_DUP_ENTRY'
}
