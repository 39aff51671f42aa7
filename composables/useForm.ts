import type { z } from 'zod'
import { fieldErrorsFromZod, type FieldErrors } from '#shared/utils/fieldErrors'

/**
 * A form bound to the same zod schema its route parses: checks on submit, shows a message per
 * field, and maps the server's field messages back onto the inputs.
 */
export function useForm<S extends z.ZodType>(schema: S, initial: z.input<S>, onValid: (value: z.output<S>) => Promise<void>) {
  const values = reactive(structuredClone(initial) as object) as z.input<S>
  const errors = ref<FieldErrors>({})
  const formError = ref('')
  const pending = ref(false)

  async function submit() {
    // Busy from the first moment, so a second click while checking or sending does nothing.
    if (pending.value) return
    pending.value = true
    errors.value = {}
    formError.value = ''
    try {
      const parsed = await schema.safeParseAsync(toRaw(values))
      if (!parsed.success) {
        errors.value = fieldErrorsFromZod(parsed.error)
        formError.value = 'Please correct the fields marked below.'
        return
      }
      await onValid(parsed.data)
    }
    catch (err) {
      const { message, fields } = readServerError(err)
      errors.value = fields
      formError.value = message
    }
    finally {
      pending.value = false
    }
  }

  return { values, errors, formError, pending, submit }
}
