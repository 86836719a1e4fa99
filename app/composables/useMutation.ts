import type { ComponentPublicInstance } from 'vue'
import type { z } from 'zod'
import { apiMessage } from '~/utils/apiErrors'

export interface MutationOptions {
  /**
   * Said when the server gave no words of its own ("The setup could not be added. Try
   * again."); a function words every failure itself (sign-in must not repeat the server).
   */
  failure: string | ((err: unknown) => string)
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
function describeFailure(err: unknown, failure: MutationOptions['failure']): string {
  return typeof failure === 'function' ? failure(err) : apiMessage(err, failure)
}

export function useMutation(options: MutationOptions) {
  const busy = ref(false)
  const failure = ref('')
  const notice = ref('')

  /** `call` words one action's failure differently (copy, not save) on the same line. */
  async function run<T>(action: () => Promise<T>, call: Partial<MutationOptions> = {}): Promise<T | undefined> {
    failure.value = ''
    notice.value = ''
    busy.value = true
    try {
      return await action()
    }
    catch (err) {
      const handle = call.handle ?? options.handle
      if (!(await handle?.(err))) failure.value = describeFailure(err, call.failure ?? options.failure)
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
/** The form's element, whether the template's ref is on a plain <form> or on <FormShell>. */
function formElement(form: Ref<HTMLElement | ComponentPublicInstance | null>): HTMLElement | null {
  const value = form.value
  return value && '$el' in value ? value.$el as HTMLElement : value
}

export function useFormMutation(options: MutationOptions) {
  // The template binds it: <FormShell ref="form">, so focus can go to the first bad field.
  const form = ref<HTMLElement | ComponentPublicInstance | null>(null)
  const fields = useFieldErrors()
  const mutation = useMutation({
    failure: options.failure,
    handle: async (err) => {
      const handled = (await options.handle?.(err)) || fields.fromApi(err)
      // A handler may have marked a field itself (a wrong current password).
      if (handled) await fields.focusFirst(formElement(form))
      return handled
    },
  })

  /** Runs `action` with the checked body, or marks the fields and does nothing. */
  async function submit<S extends z.ZodType, T>(schema: S, values: unknown, action: (body: z.output<S>) => Promise<T>): Promise<T | undefined> {
    const body = fields.check(schema, values)
    if (body === undefined) {
      mutation.failure.value = ''
      mutation.notice.value = ''
      await fields.focusFirst(formElement(form))
      return undefined
    }
    return mutation.run(() => action(body))
  }

  return { ...mutation, ...fields, form, submit }
}
