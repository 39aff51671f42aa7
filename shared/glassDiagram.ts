import { DEFAULT_WETTED_WALL_M } from './science/air'
import type { TearsSuppressedBy } from './science/glassModel'
import { rangeText } from './science/predictions'
import type { Range } from './science/uncertainty'

/** A glass's shape: bowl diameter and fill height in mm, wall angle in degrees from horizontal. */
export interface GlassShape { name: string, bowlDiameterMm: number, wallAngleDeg: number, fillHeightMm: number }
/** The prediction fields the diagram draws (a subset of the glass model's TearPrediction). */
export interface DiagramPrediction {
  tearsExpected: boolean
  /** Whether a steady band stands clear of the meniscus; absent counts as true. */
  bandVisible?: boolean
  /** Why no tears run although a film is drawn: beer's foam, or a surface held still. */
  suppressedBy?: TearsSuppressedBy
  clearBandHeight_mm: number
  meniscusHeight_mm: number
  tearWidth_mm: number | null
  tearFallSpeed_mm_s: number | null
  /** The 10th–90th percentile ranges the labels and the text print (never a lone value). */
  ranges?: { clearBandHeight_mm: Range | null, tearFallSpeed_mm_s: Range | null }
}

/**
 * What the diagram shows: a steady band with tears falling from its ridge; a low band with legs
 * running down from where the swirl left the liquid; foam rings (beer); or nothing that climbs.
 */
export type DiagramShow = 'band' | 'swirl' | 'foam' | 'none'

/**
 * Height up the wall that a swirl wets, mm: the model's own wetted wall (DEFAULT_WETTED_WALL_M),
 * so the line the legs are drawn from is where the model's curtain starts.
 */
const SWIRL_WALL_MM = DEFAULT_WETTED_WALL_M * 1000

/** A band drawn at least this long, mm, so a band inside the meniscus still shows as a sliver. */
const LOW_BAND_MIN_MM = 1.2

/**
 * Width of one character of the label font, in ems: a generous figure for a sans-serif's digits,
 * en dashes and lower case (about 0.5–0.56 em; common practice, no source), so the label's box
 * is never narrower than its text and the SVG never clips it.
 */
const LABEL_CHAR_EM = 0.62

/** Line height of the labels, in ems. */
const LABEL_LINE_EM = 1.2

/** A label beside the glass: its lines, where it points on the wall, and where it is drawn. */
export interface DiagramLabel {
  lines: string[]
  /** Point on the right wall the label names. */
  anchorX: number
  anchorY: number
  /** Baseline of the first line. */
  y: number
  /** Leader from the wall to the label. */
  leader: { x1: number, y1: number, x2: number, y2: number }
}

/** The band's range for a label or a sentence: "6.1–19 mm", never a lone value when a range is known. */
function bandText(p: DiagramPrediction): string {
  const r = p.ranges?.clearBandHeight_mm
  return r ? rangeText(r, 'mm') : `about\u00a0${Math.round(p.clearBandHeight_mm)}\u00a0mm`
}

function speedText(p: DiagramPrediction): string {
  const r = p.ranges?.tearFallSpeed_mm_s
  const v = p.tearFallSpeed_mm_s ?? 0
  return r ? rangeText(r, 'mm/s') : `about\u00a0${v.toFixed(v < 1 ? 2 : 1)}\u00a0mm/s`
}

/** Which picture a prediction gets (see DiagramShow). */
function diagramShow(p: DiagramPrediction): DiagramShow {
  if (p.tearsExpected) return p.bandVisible === false ? 'swirl' : 'band'
  return p.suppressedBy === 'foam' ? 'foam' : 'none'
}

/**
 * Geometry of the glass diagram in millimetres (the SVG's own units). The bowl is a rounded cup
 * whose wall, from the liquid line up, leans at the glass's wall angle; the band is drawn along
 * the wall for its predicted length, and tears are spaced about three tear widths apart. A film
 * whose band stays inside the meniscus is drawn as a sliver of band, the swirled wall above it and
 * legs running down from the swirl line. `viewBox` leaves a fixed margin on the right (the compact
 * diagrams and the card); `labelledViewBox` is wide and tall enough for every label's text.
 */
export function glassDiagramGeometry(glass: GlassShape, p: DiagramPrediction) {
  const show = diagramShow(p)
  const r = glass.bowlDiameterMm / 2
  const fill = glass.fillHeightMm
  const sinWall = Math.sin((glass.wallAngleDeg * Math.PI) / 180)
  const band = show === 'band'
    ? Math.min(Math.max(p.clearBandHeight_mm, 0), 60)
    : show === 'swirl' ? Math.min(Math.max(p.clearBandHeight_mm, LOW_BAND_MIN_MM), 60) : 0
  const above = show === 'swirl' ? Math.max(SWIRL_WALL_MM * sinWall + 10, 24) : Math.max(band + 14, 24)
  const height = fill + above
  const lean = 1 / Math.tan((glass.wallAngleDeg * Math.PI) / 180) // mm inward per mm up
  const margin = 6
  const labelRoom = 34
  const width = 2 * r + 2 * margin + labelRoom
  const cx = margin + r
  const bottomY = height + margin
  const fillY = bottomY - fill
  const rimY = margin
  const xAt = (y: number, side: -1 | 1) => {
    // Below the liquid line: a rounded bottom; above: straight wall leaning by `lean`.
    if (y >= fillY) {
      const t = Math.min(1, (y - fillY) / fill)
      return cx + side * r * Math.sqrt(Math.max(0, 1 - t * t * 0.92))
    }
    return cx + side * (r - (fillY - y) * lean)
  }
  const outlinePts: string[] = []
  for (let y = rimY; y <= bottomY; y += 1) outlinePts.push(`${xAt(y, -1).toFixed(2)},${y.toFixed(2)}`)
  const rightPts: string[] = []
  for (let y = bottomY; y >= rimY; y -= 1) rightPts.push(`${xAt(y, 1).toFixed(2)},${y.toFixed(2)}`)
  const outline = `M${outlinePts.join(' L')} L${rightPts.join(' L')}`

  const liquidLeft: string[] = []
  for (let y = fillY; y <= bottomY; y += 1) liquidLeft.push(`${xAt(y, -1).toFixed(2)},${y.toFixed(2)}`)
  const liquidRight: string[] = []
  for (let y = bottomY; y >= fillY; y -= 1) liquidRight.push(`${xAt(y, 1).toFixed(2)},${y.toFixed(2)}`)
  const liquidPath = `M${liquidLeft.join(' L')} L${liquidRight.join(' L')} Z`

  const stroke = Math.max(1.2, glass.bowlDiameterMm / 55)
  // The film is a few tens of micrometres thick; it is drawn a few millimetres wide to be seen.
  const film = Math.max(2.2, glass.bowlDiameterMm / 28)
  const strip = (fromY: number, toY: number, side: -1 | 1) => `M${xAt(fromY, side)},${fromY} L${xAt(toY, side)},${toY} L${xAt(toY, side) - side * film},${toY} L${xAt(fromY, side) - side * film},${fromY} Z`
  const ridgeAt = (y: number) => ({ y, y2: y + 0.01, leftX1: xAt(y, -1), leftX2: xAt(y, -1) + 2 * film, rightX1: xAt(y, 1), rightX2: xAt(y, 1) - 2 * film })
  const tearSize = (w: number) => ({ rx: Math.max(2.2, Math.min(w * 0.7, 3.2)), ry: Math.max(3.4, Math.min(w * 1.3, 5.5)) })

  const topY = fillY - band * sinWall
  const bandShapes = band > 0 ? { left: strip(fillY, topY, -1), right: strip(fillY, topY, 1), ridge: ridgeAt(topY) } : null
  const tears: { x: number, y: number, rx: number, ry: number }[] = []
  let swirl = null
  if (show === 'band' && p.tearWidth_mm) {
    const w = p.tearWidth_mm
    const count = Math.max(1, Math.min(4, Math.floor(band / (3 * w))))
    const { rx, ry } = tearSize(w)
    for (let i = 0; i < count; i++) {
      const y = topY + (i + 0.7) * (band / (count + 0.5))
      tears.push({ x: xAt(y, -1) + film * 0.9, y, rx, ry })
      tears.push({ x: xAt(y, 1) - film * 0.9, y: y + band / (count * 2.5), rx, ry })
    }
  }
  if (show === 'swirl') {
    const swirlY = fillY - SWIRL_WALL_MM * sinWall
    swirl = { curtainLeft: strip(topY, swirlY, -1), curtainRight: strip(topY, swirlY, 1), line: ridgeAt(swirlY) }
    const w = p.tearWidth_mm ?? 2
    const { rx, ry } = tearSize(w)
    const span = topY - swirlY
    const count = Math.max(1, Math.min(3, Math.floor(span / (4 * w))))
    for (let i = 0; i < count; i++) {
      const y = swirlY + (i + 0.8) * (span / (count + 0.4))
      tears.push({ x: xAt(y, -1) + film * 0.9, y, rx, ry })
      tears.push({ x: xAt(y, 1) - film * 0.9, y: Math.min(topY - ry, y + span / (count * 2.2)), rx, ry })
    }
  }
  const rings: { x1: number, x2: number, y: number }[] = []
  if (show === 'foam') {
    for (const up of [5, 10, 15]) {
      const y = fillY - up * sinWall
      rings.push({ x1: xAt(y, -1), x2: xAt(y, -1) + 2.2 * film, y }, { x1: xAt(y, 1), x2: xAt(y, 1) - 2.2 * film, y })
    }
  }

  // Labels on the right, one per feature, pushed apart so that none overlaps the next.
  const font = Math.max(4.5, glass.bowlDiameterMm / 12)
  const labelX = cx + r + 4
  const wanted: { lines: string[], anchorY: number }[] = [{ lines: ['liquid line'], anchorY: fillY }]
  if (show === 'band') wanted.push({ lines: ['clear band', bandText(p)], anchorY: topY })
  if (show === 'swirl') {
    wanted.push({ lines: ['low band', bandText(p)], anchorY: topY })
    wanted.push({ lines: ['legs run from', 'the swirl line'], anchorY: swirl!.line.y })
  }
  if (show === 'foam') wanted.push({ lines: ['foam rings,', 'no tears'], anchorY: fillY - 10 * sinWall })
  if (show === 'none') wanted.push({ lines: ['no clear band,', 'no tears'], anchorY: fillY - 10 * sinWall })
  const lineH = font * LABEL_LINE_EM
  const gap = font * 0.35
  const labels: DiagramLabel[] = []
  let limit = Number.POSITIVE_INFINITY // top of the label below
  for (const w of [...wanted].sort((a, b) => b.anchorY - a.anchorY)) {
    const h = w.lines.length * lineH
    const top = Math.min(w.anchorY - h / 2, limit - gap - h)
    limit = top
    const anchorX = xAt(w.anchorY, 1)
    labels.push({
      lines: w.lines, anchorX, anchorY: w.anchorY, y: top + font * 0.9,
      leader: { x1: anchorX + 0.8, y1: w.anchorY, x2: labelX - 1, y2: top + h / 2 },
    })
  }
  const textWidth = Math.max(...labels.flatMap(l => l.lines.map(s => s.length))) * font * LABEL_CHAR_EM
  const viewTop = Math.min(0, limit - 1)
  const viewHeight = bottomY + margin - viewTop

  return {
    show,
    viewBox: `0 0 ${width.toFixed(1)} ${(bottomY + margin).toFixed(1)}`,
    labelledViewBox: `0 ${viewTop.toFixed(1)} ${(labelX + textWidth + 2).toFixed(1)} ${viewHeight.toFixed(1)}`,
    outline,
    liquidPath,
    band: bandShapes,
    swirl,
    rings,
    tears,
    stroke,
    fillY,
    labels,
    labelX,
    lineHeight: lineH,
    font,
    description(label: string) {
      const where = `${label}: in the ${glass.name.toLowerCase()},`
      switch (show) {
        case 'band':
          return `${where} a clear band ${bandText(p)} high above the liquid, with tears sliding back at ${speedText(p)}.`
        case 'swirl':
          return `${where} the band stays low (${bandText(p)}, inside the curve of the liquid's edge), but the film a swirl leaves on the glass runs down as legs at ${speedText(p)}.`
        case 'foam':
          return `${where} rings of foam are left on the glass as the level drops, and no tears.`
        default:
          return p.clearBandHeight_mm > 0
            ? `${where} no clear band and no distinct tears: the film's pull is too small to move the surface.`
            : `${where} no climbing film or tears are expected.`
      }
    },
  }
}
