import type { MessageAnswer } from '#shared/types/account'

/** A signed-in guest asks for a new link to confirm their address. */
export function useAddressCheck() {
  const message = ref('')
  const error = ref('')
  const pending = ref(false)
  async function resend() {
    pending.value = true
    message.value = ''
    error.value = ''
    try {
      message.value = (await $fetch<MessageAnswer>('/api/account/address-check', { method: 'POST' })).message
    }
    catch (err) {
      error.value = (err as { data?: { message?: string } }).data?.message ?? 'We could not send the link. Please try again.'
    }
    finally { pending.value = false }
  }
  return { message, error, pending, resend }
}
