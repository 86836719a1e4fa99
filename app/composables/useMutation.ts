import type { z } from 'zod'
import { apiMessage } from '~/utils/apiErrors'

export interface MutationOptions {
  /** Said when the server gave no words of its own ("The setup could not be added. Try again."). */
  failure: string
  /**
   * Takes an error before the failure line does (a stale version opening the conflict
   * dialog, field problems going beside their fields): true when it was handled.
   */
  handle?: (err: unknown) => boolean | Promise<boolean>
}

/**
 * The one way a page changes something on the server: `run` clears the last lines,
 * marks the action busy (buttons disable on it), and on failure says the server's own
 * words or the fallback; `notice` is for the success line the caller writes.
 */
export function useMutation(options: MutationOptions) {
  const busy = ref(false)
  const failure = ref('')
  const notice = ref('')

  async function run<T>(action: () => Promise<T>): Promise<T | undefined> {
    failure.value = ''
    notice.value = ''
    busy.value = true
    try {
      return await action()
    }
    catch (err) {
      if (!(await options.handle?.(err))) failure.value = apiMessage(err, options.failure)
      return undefined
    }
    finally {
      busy.value = false
    }
  }

  return { busy, failure, notice, run }
}

/**
 * A form's submit: the same zod schema the server uses checks the values first (errors
 * beside their fields, focus on the first), then `useMutation` runs the request; the
 * server's field problems go beside their fields too.
 */
export function useFormMutation(form: Ref<HTMLElement | null>, options: MutationOptions) {
  const fields = useFieldErrors()
  const mutation = useMutation({
    failure: options.failure,
    handle: async (err) => {
      if (await options.handle?.(err)) return true
      if (!fields.fromApi(err)) return false
      await fields.focusFirst(form.value)
      return true
    },
  })

  /** Runs `action` with the checked body, or marks the fields and does nothing. */
  async function submit<S extends z.ZodType, T>(schema: S, values: unknown, action: (body: z.output<S>) => Promise<T>): Promise<T | undefined> {
    mutation.failure.value = ''
    mutation.notice.value = ''
    const body = fields.check(schema, values)
    if (body === undefined) {
      await fields.focusFirst(form.value)
      return undefined
    }
    return mutation.run(() => action(body))
  }

  return { ...mutation, ...fields, submit }
}
