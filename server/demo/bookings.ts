/**
 * Invented guests and bookings for the demo sessions, so the manager's bookings view has
 * something to show. These guests have no password (they cannot sign in) and their payments are
 * marked as made outside online checkout: nothing here touches the payment provider.
 */
export const DEMO_GUESTS = [
  { email: 'ines.calloway@example.test', name: 'Ines Calloway', dateOfBirth: '1979-06-02', phone: '+1 207 555 0142' },
  { email: 'ruben.okafor@example.test', name: 'Ruben Okafor-Lind', dateOfBirth: '1991-11-23', phone: '+1 207 555 0178' },
  { email: 'hattie.marchetti@example.test', name: 'Hattie Marchetti', dateOfBirth: '1985-03-09', phone: '(207) 555-0111' },
  { email: 'sol.brennan@example.test', name: 'Sol Brennan', dateOfBirth: '1996-08-30', phone: '+1 617 555 0190' },
  { email: 'wen.adeyemi@example.test', name: 'Wen Adeyemi', dateOfBirth: '1972-01-15', phone: '+1 207 555 0163' },
]

/** Which demo session (index in start order), who, how many, and how it stands. */
export const DEMO_BOOKINGS: { session: number, guest: number, partySize: number, state: 'confirmed' | 'refunded' }[] = [
  { session: 0, guest: 0, partySize: 2, state: 'confirmed' },
  { session: 0, guest: 1, partySize: 4, state: 'confirmed' },
  { session: 0, guest: 2, partySize: 1, state: 'refunded' },
  { session: 1, guest: 3, partySize: 2, state: 'confirmed' },
  { session: 1, guest: 4, partySize: 6, state: 'confirmed' },
  { session: 2, guest: 2, partySize: 3, state: 'confirmed' },
  { session: 3, guest: 0, partySize: 2, state: 'confirmed' },
]
