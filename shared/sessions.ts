export const SESSION_STATUSES = ['open', 'closed', 'cancelled'] as const
export type SessionStatus = (typeof SESSION_STATUSES)[number]
export const SESSION_STATUS_LABELS: Record<SessionStatus, string> = { open: 'Open', closed: 'Closed to booking', cancelled: 'Cancelled' }
