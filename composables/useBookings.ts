import type { BookingView } from '#shared/bookings'

/** A guest's actions on their bookings; each refreshes the lists that show them. */
export function useBookingActions() {
  const error = ref('')
  const message = ref('')
  const pending = ref(false)

  async function run(action: () => Promise<BookingView>, done: (b: BookingView) => string) {
    error.value = ''
    message.value = ''
    pending.value = true
    try {
      const booking = await action()
      message.value = done(booking)
      await refreshNuxtData(['my-bookings', `booking-${booking.id}`])
      return booking
    }
    catch (err) {
      error.value = readServerError(err).message
      return null
    }
    finally {
      pending.value = false
    }
  }

  const cancel = (id: number) => run(
    () => $fetch<BookingView>(`/api/bookings/${id}/cancel`, { method: 'POST' }),
    b => (b.state === 'refunded' ? 'Booking cancelled and refunded. We have e-mailed you.' : 'Booking cancelled. Your refund is on its way; we will e-mail you when it has gone through.'),
  )
  const release = (id: number) => run(
    () => $fetch<BookingView>(`/api/bookings/${id}/release`, { method: 'POST' }),
    () => 'The seats are given back. Nothing was charged.',
  )
  return { error, message, pending, cancel, release }
}
