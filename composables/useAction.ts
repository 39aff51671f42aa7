import type { FieldErrors } from '#shared/utils/fieldErrors'

/**
 * The busy / message / error pattern of every button that calls the server: `run` clears the
 * last outcome, marks the action busy, awaits it, then shows the success text (a string, or built
 * from the answer) or the server's message and field errors. Returns the answer, or null if it failed.
 */
export function useAction() {
  const busy = ref(false)
  const message = ref('')
  const error = ref('')
  const fields = ref<FieldErrors>({})

  function clear() {
    message.value = ''
    error.value = ''
    fields.value = {}
  }

  async function run<T>(action: () => Promise<T>, done: string | ((answer: T) => string), after?: (answer: T) => Promise<unknown> | unknown): Promise<T | null> {
    clear()
    busy.value = true
    try {
      const answer = await action()
      message.value = typeof done === 'function' ? done(answer) : done
      await after?.(answer)
      return answer
    }
    catch (err) {
      const e = readServerError(err)
      error.value = e.message
      fields.value = e.fields
      return null
    }
    finally {
      busy.value = false
    }
  }

  return { busy, message, error, fields, clear, run }
}
