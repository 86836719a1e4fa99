import type { z } from 'zod'
import type { FieldIssue } from '#shared/types/users'
import { apiFieldIssues } from '~/utils/apiErrors'

/**
 * Inline field errors for one form, filled from the same zod schema the server
 * uses, or from the server's 400 answer. Keys are field paths ("email");
 * problems with no field land under "".
 */
export function useFieldErrors() {
  const errors = ref<Record<string, string>>({})

  function fromIssues(issues: FieldIssue[]) {
    const next: Record<string, string> = {}
    for (const issue of issues) next[issue.path] ??= issue.message
    errors.value = next
  }

  function check<S extends z.ZodType>(schema: S, values: unknown): z.output<S> | undefined {
    const result = schema.safeParse(values)
    if (result.success) {
      errors.value = {}
      return result.data
    }
    fromIssues(result.error.issues.map(i => ({ path: i.path.map(String).join('.'), message: i.message })))
    return undefined
  }

  /** Takes field problems from a 400 answer; false when the error carried none. */
  function fromApi(err: unknown): boolean {
    const issues = apiFieldIssues(err)
    if (!issues.length) return false
    fromIssues(issues)
    return true
  }

  function set(path: string, message: string) {
    errors.value = { ...errors.value, [path]: message }
  }

  function clear() {
    errors.value = {}
  }

  /** Moves focus to the first field marked invalid, so keyboard and screen reader users land on it. */
  async function focusFirst(form: HTMLElement | null | undefined) {
    await nextTick()
    form?.querySelector<HTMLElement>('[aria-invalid="true"]')?.focus()
  }

  return { errors, check, fromApi, set, clear, focusFirst }
}
