import { REFERENCE_LENGTH, isReference, normalizeReference } from '#shared/bookings'
import { formatDay, formatDayTime, formatTime } from '#shared/dates'
import type { HostDay, HostParty, HostPartyFound } from '#shared/types/host'

/**
 * Finds a party by the reference the guest shows at the door, typed or read from its QR code, and
 * takes the host to its row on the day's list, or says plainly where it belongs instead: another
 * day (with a way there), another session, or a booking that ended.
 */
export function useFindParty(date: Ref<string>, day: Ref<HostDay | null | undefined>) {
  const clock = useDoorClock()
  const { busy, error, run, clear } = useAction()
  const found = ref<HostPartyFound | null>(null)
  let landing = false

  /** The found party's id while it is on the day shown (its row is highlighted). */
  const foundId = computed(() => (found.value?.onList && found.value.session.date === date.value ? found.value.party.id : null))
  /** The found party's day, when it is on another day's list. */
  const otherDay = computed(() => (found.value?.onList && found.value.session.date !== date.value ? found.value.session : null))

  function atTheDoor(p: HostParty): string {
    if (p.state === 'confirmed') return 'To come: seat them on their row.'
    if (p.state === 'held') return 'Still paying online.'
    if (p.state === 'checked_in') return p.checkIn ? `Already seated, ${p.checkIn.seated} of ${p.partySize}.` : 'Already seated.'
    const what = p.checkIn?.outcome === 'turned_away' ? 'Turned away' : 'Marked as did not come'
    return p.canUndo ? `${what}; you can undo that on their row.` : `${what}.`
  }

  /** What the host reads about the found party, for the day shown. */
  const result = computed(() => {
    const f = found.value
    if (!f) return ''
    const p = f.party
    const who = `${p.contactName}, party of ${p.partySize}`
    if (!f.onList) return `Booking ${p.reference} (${who}, ${f.session.flightName} ${formatDayTime(f.session.startsAt, clock.value)}) is ${p.stateLabel.toLowerCase()}: it is on no list.`
    if (f.session.date !== date.value) return `Booking ${p.reference} (${who}) is for another day: ${f.session.flightName}, ${formatDayTime(f.session.startsAt, clock.value)}.`
    const running = day.value?.sessions.find(s => s.started && !s.ended && s.id !== f.session.id)
    // As the day's list has it now (seated, marked or undone since it was found).
    const live = day.value?.sessions.flatMap(s => s.parties).find(x => x.id === p.id) ?? p
    const session = `the ${formatTime(f.session.startsAt, clock.value)} session (${f.session.flightName})${running ? `, not the one running now (${formatTime(running.startsAt, clock.value)})` : ''}`
    return `${who}, booking ${p.reference}, in ${session}. ${atTheDoor(live)}`
  })

  async function find(text: string, how: 'typed' | 'scanned') {
    found.value = null
    const reference = normalizeReference(text)
    if (!isReference(reference)) {
      clear()
      error.value = how === 'scanned'
        ? `That QR code is not a booking's code (it reads "${text.slice(0, 60)}"). Type the reference instead.`
        : reference.length === REFERENCE_LENGTH
          ? `"${text.trim()}" has a character no booking reference uses. Check it with the guest.`
          : `A booking reference has ${REFERENCE_LENGTH} letters and digits; "${text.trim()}" has ${reference.length}. Check it with the guest.`
      return
    }
    found.value = await run(() => $fetch<HostPartyFound>(`/api/bookings/by-reference/${reference}`), '')
    landing = true
  }

  /** Opens the found party's day; its row is shown once the day has loaded. */
  function openOtherDay() {
    if (!otherDay.value) return
    date.value = otherDay.value.date
    landing = true
  }

  // Scroll to and focus the found row once it is on the page (after a find, or after the day loads).
  watch([foundId, day], async () => {
    if (!landing || !foundId.value) return
    await nextTick()
    const row = document.getElementById(`party-${foundId.value}`)
    if (!row) return
    landing = false
    row.scrollIntoView({ block: 'center' })
    row.focus({ preventScroll: true })
  })

  return { find, busy, error, result, foundId, otherDay, otherDayLabel: computed(() => (otherDay.value ? formatDay(otherDay.value.startsAt, clock.value) : '')), openOtherDay }
}
