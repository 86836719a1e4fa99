import { z } from 'zod'

/**
 * A password form's schema: the server's body plus a `repeat` field that must equal
 * the new password, with the mismatch shown beside the repeat field.
 */
export function withRepeatedPassword<S extends z.ZodObject>(body: S, passwordField: string, mismatch: string) {
  return body.extend({ repeat: z.string() }).refine(
    values => (values as Record<string, unknown>)[passwordField] === values.repeat,
    { path: ['repeat'], message: mismatch },
  )
}
