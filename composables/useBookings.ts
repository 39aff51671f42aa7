import type { BookingView } from '#shared/types/bookings'

/** A guest's actions on their bookings; each refreshes the lists that show them. */
export function useBookingActions() {
  const { busy: pending, message, error, run } = useAction()
  const refresh = (b: BookingView) => refreshNuxtData(['my-bookings', `booking-${b.id}`])

  const cancel = (id: number) => run(
    () => $fetch<BookingView>(`/api/bookings/${id}/cancel`, { method: 'POST' }),
    b => (b.state === 'refunded' ? 'Booking cancelled and refunded. We have e-mailed you.' : 'Booking cancelled. Your refund is on its way; we will e-mail you when it has gone through.'),
    refresh,
  )
  const release = (id: number) => run(
    () => $fetch<BookingView>(`/api/bookings/${id}/release`, { method: 'POST' }),
    'The seats are given back. Nothing was charged.',
    refresh,
  )
  return { error, message, pending, cancel, release }
}
