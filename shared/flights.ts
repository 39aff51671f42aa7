export const FLIGHT_STATUSES = ['draft', 'published', 'retired'] as const
export type FlightStatus = (typeof FLIGHT_STATUSES)[number]
export const FLIGHT_STATUS_LABELS: Record<FlightStatus, string> = { draft: 'Draft', published: 'Published', retired: 'Retired' }
export const POURS_MIN = 2
export const POURS_MAX = 8
