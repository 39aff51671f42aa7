import QRCode from 'qrcode'
import { idParam } from '../../../../shared/schemas/common'

/** The booking reference as a QR code for the door (the same code the confirmation e-mail carries). */
export default defineEventHandler(async (event) => {
  const user = await requireUser(event)
  const { id } = await readParamsAs(event, idParam)
  const booking = await loadGuestBooking(user.id, id)
  setResponseHeader(event, 'content-type', 'image/svg+xml; charset=utf-8')
  setResponseHeader(event, 'cache-control', 'no-store')
  return QRCode.toString(booking.reference, { type: 'svg', margin: 1, errorCorrectionLevel: 'M', color: { dark: '#1e2326', light: '#ffffff' } })
})
