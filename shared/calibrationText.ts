/**
 * Which calibration a glass's predictions use, and the words that tell a guest so. Pure; the server
 * runs the fit (server/utils/calibration.ts), the pour page and the card print these lines.
 */
import { type AppliedCalibration, type GroupCalibration, appliedCalibration } from './science/calibration'

/**
 * The calibration for one glass in one room: the glass-in-room group when it is applied, else the
 * glass over every room when that is applied, else null (the published defaults).
 */
export function pickAppliedGroup(groups: GroupCalibration[], glassKey: string, roomKey: string): AppliedCalibration | null {
  const inRoom = groups.find(g => g.glassKey === glassKey && g.roomKey === roomKey && g.status === 'applied')
  const overall = groups.find(g => g.glassKey === glassKey && g.roomKey === null && g.status === 'applied')
  const g = inRoom ?? overall
  return g ? appliedCalibration(g) : null
}

const readings = (n: number) => `${n} reading${n === 1 ? '' : 's'}`

/**
 * The pour page's sentence when its figures are tuned; null when they are the model's published
 * defaults (then nothing is said).
 */
export function calibrationSentence(c: AppliedCalibration | null): string | null {
  if (!c) return null
  return `These ranges are tuned to this glass by ${readings(c.observations)} that guests and hosts took here, rather than the model's published defaults.`
}

/** "pours 1 and 3", "pour 2", "pours 1, 2 and 4". */
function pourList(positions: number[]): string {
  if (positions.length === 1) return `pour ${positions[0]}`
  return `pours ${positions.slice(0, -1).join(', ')} and ${positions.at(-1)}`
}

/**
 * The card's one line about tuned figures, grouped by glass with the readings behind each; null when every
 * pour uses the defaults.
 */
export function calibrationCardLine(pours: { position: number, glass: string, calibration: AppliedCalibration | null }[]): string | null {
  const byGlass = new Map<string, [number, number[]]>()
  for (const p of pours) {
    if (!p.calibration) continue
    const g = byGlass.get(p.glass) ?? [p.calibration.observations, []]
    g[1].push(p.position)
    byGlass.set(p.glass, g)
  }
  if (!byGlass.size) return null
  const groups = [...byGlass.values()]
  if (groups.length === 1) {
    const [n, positions] = groups[0]!
    return `Tuned here: figures for ${pourList(positions)} rest on ${readings(n)} of ${positions.length === 1 ? 'its' : 'their'} glass taken at this venue.`
  }
  return `Tuned here, from readings of each glass taken at this venue: ${groups.map(([n, positions]) => `${pourList(positions)} (${readings(n)})`).join(', ')}.`
}
