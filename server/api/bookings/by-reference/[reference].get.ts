import type { HostPartyFound } from '../../../../shared/types/host'
import { referenceParams } from '../../../../shared/schemas/host'

/**
 * A party found by the reference the guest shows at the door (typed, or read from its QR code):
 * any case, spaces and dashes ignored, O/I/L read as 0/1. For the session's host or a manager;
 * unknown → 404; a booking of another host's session → 403 that says whose.
 */
export default defineEventHandler(async (event): Promise<HostPartyFound> => {
  const user = await requireRole(event, 'host', 'manager')
  const { reference } = await readParamsAs(event, referenceParams)
  return partyByReference(await getVenue(), user, reference)
})
