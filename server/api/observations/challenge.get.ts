import type { ObservationChallenge } from '../../../shared/observationChallenge'

/**
 * A bot check for one guest's observation (public): a signed, expiring, single-use challenge the
 * browser solves with SHA-256. Sets the device's random cookie if it has none.
 */
export default defineEventHandler((event): ObservationChallenge => {
  limitClient(event, 'challengePerClient', 'Too many bot checks from this address in the last hour; try again later.')
  ensureDeviceCookie(event)
  return issueObservationChallenge()
})
