/**
 * The glass drawing: one pour's glass, liquid, climbing film and tears as a list of primitives in
 * millimetres, drawn to scale. The web pages render the list as SVG (components/glass/GlassDiagram.vue,
 * glassDrawingSvg) and the flight card as PDF vectors (server/cards/pdfDrawing.ts), so every view shows
 * the same picture.
 *
 * What is to scale: the bowl's diameter, the wall's angle and the fill height; the band's length along
 * the wall, read on a millimetre scale that starts at the liquid line; the range of the band, shaded
 * on that scale; the tears' width and, on the front half of the glass, their number and spacing.
 * What is not: the film itself is micrometres thick and is drawn as a tinted face of the wall.
 */
import { DEFAULT_WETTED_WALL_M } from './science/air'
import type { TearsSuppressedBy } from './science/glassModel'
import { rangeText } from './science/predictions'
import type { Range } from './science/uncertainty'
import { LIQUID_COLOUR_FILL, type LiquidColour } from './liquidColours'

/** A glass's shape: bowl diameter and fill height in mm, wall angle in degrees from horizontal. */
export interface GlassShape { name: string, bowlDiameterMm: number, wallAngleDeg: number, fillHeightMm: number }

/** The prediction fields the drawing uses (a subset of the glass model's TearPrediction). */
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
  tearSpacing_mm?: number | null
  tearsAround?: number | null
  /** The 10th–90th percentile ranges the labels and the text print (never a lone value). */
  ranges?: { clearBandHeight_mm: Range | null, tearFallSpeed_mm_s: Range | null, tearsAround?: Range | null }
}

/**
 * What the drawing shows: a steady band with tears falling from its ridge; a low band with legs
 * running down from where the swirl left the liquid; foam rings (beer); or nothing that climbs.
 */
export type DiagramShow = 'band' | 'swirl' | 'foam' | 'none'

export type DrawPalette = 'light' | 'dark'

/** What a primitive stands for, so that tests and styles can find it. */
export type DrawRole = 'glass' | 'liquid' | 'surface' | 'film' | 'ridge' | 'curtain' | 'swirl-line' | 'tear' | 'foam'
  | 'scale' | 'scale-ticks' | 'scale-major' | 'scale-number' | 'range' | 'band-mark' | 'label' | 'leader'

export type DrawItem
  = | { kind: 'path', d: string, fill?: string, fillOpacity?: number, stroke?: string, strokeWidth?: number, dash?: string, role?: DrawRole }
    | { kind: 'ellipse', cx: number, cy: number, rx: number, ry: number, fill: string, fillOpacity?: number, role?: DrawRole }
    | { kind: 'line', x1: number, y1: number, x2: number, y2: number, stroke: string, strokeWidth: number, dash?: string, role?: DrawRole }
    | { kind: 'text', x: number, y: number, text: string, size: number, fill: string, anchor: 'start' | 'middle' | 'end', weight?: 'regular' | 'semibold', role?: DrawRole }

export interface GlassDrawing {
  /** The box that holds every item, labels included, in mm. */
  viewBox: { x: number, y: number, width: number, height: number }
  items: DrawItem[]
  /** The drawing in words, with the ranges: the SVG's title and the figure's caption. */
  description: string
  show: DiagramShow
  /** The scale beside the right wall: where 0 mm is, the unit step along the wall, its length in mm. */
  scale: { x0: number, y0: number, ux: number, uy: number, lengthMm: number }
  /** Tears drawn on the front half of the glass, and the spacing they are drawn at, mm (arc). */
  tears: { drawn: number, spacingMm: number | null }
}

export interface GlassDrawingInput {
  glass: GlassShape
  prediction: DiagramPrediction
  colour: LiquidColour
  palette: DrawPalette
  label: string
  /** Full labels and scale numbers beside the glass, or none (compact lists, the card). */
  labels: boolean
}

/** Outline, scale and label colours per page background; the liquid keeps its own colour. */
const PALETTES: Record<DrawPalette, { glass: string, ink: string, soft: string, film: string, ridge: string, range: string, foam: string, tearEdge: string }> = {
  light: { glass: '#4a5459', ink: '#2b3236', soft: '#5f696e', film: '#e0a54a', ridge: '#8a5a12', range: '#2f7f86', foam: '#b59d6c', tearEdge: '#5f3d0c' },
  dark: { glass: '#c3ccd0', ink: '#eef2f3', soft: '#b6c0c4', film: '#f0b760', ridge: '#f6cf86', range: '#6cc6cc', foam: '#e2d2a8', tearEdge: '#f6e2b8' },
}

/** Height up the wall that a swirl wets, mm: the model's own wetted wall, where its curtain starts. */
const SWIRL_WALL_MM = DEFAULT_WETTED_WALL_M * 1000

/** A band drawn at least this long, mm, so a band inside the meniscus still shows as a sliver. */
const LOW_BAND_MIN_MM = 1.2

/** The longest band drawn, mm (the scale and the glass grow with the band up to here). */
const BAND_MAX_MM = 60

/** At most this many tears on the front face; more would merge into a fringe at any size. */
const MAX_FRONT_TEARS = 14

/**
 * Width of one character of the label font, in ems: generous for a serif's or a sans-serif's
 * digits, en dashes and lower case (about 0.5–0.56 em; common practice, no source), so the
 * viewBox is never narrower than the text and no label is clipped.
 */
const CHAR_EM = 0.62

/** Label size and scale-number size, mm of the drawing. */
const LABEL_MM = 5.2
const NUMBER_MM = 4

const r1 = (v: number) => Math.round(v * 10) / 10
const r2 = (v: number) => Math.round(v * 100) / 100
const pt = (x: number, y: number) => `${r1(x)},${r1(y)}`

function diagramShow(p: DiagramPrediction): DiagramShow {
  if (p.tearsExpected) return p.bandVisible === false ? 'swirl' : 'band'
  return p.suppressedBy === 'foam' ? 'foam' : 'none'
}

function bandText(p: DiagramPrediction): string {
  const r = p.ranges?.clearBandHeight_mm
  return r ? rangeText(r, 'mm') : `about\u00a0${Math.round(p.clearBandHeight_mm)}\u00a0mm`
}

function speedText(p: DiagramPrediction): string {
  const r = p.ranges?.tearFallSpeed_mm_s
  const v = p.tearFallSpeed_mm_s ?? 0
  return r ? rangeText(r, 'mm/s') : `about\u00a0${v.toFixed(v < 1 ? 2 : 1)}\u00a0mm/s`
}

function aroundText(p: DiagramPrediction): string | null {
  const r = p.ranges?.tearsAround
  if (r) {
    const lo = Math.max(1, Math.round(r.low))
    const hi = Math.max(lo, Math.round(r.high))
    return lo === hi ? `about ${lo}` : `${lo}–${hi}`
  }
  return p.tearsAround ? `about ${Math.round(p.tearsAround)}` : null
}

/** Tears on the front half: half the tears around, at least one, at most MAX_FRONT_TEARS. */
function frontTears(p: DiagramPrediction, frontArcMm: number): number {
  const spacing = p.tearSpacing_mm ?? (p.tearWidth_mm ? 3 * p.tearWidth_mm : 6)
  const around = p.tearsAround ?? (2 * frontArcMm) / spacing
  return Math.max(1, Math.min(MAX_FRONT_TEARS, Math.round(around / 2)))
}

function describe(glass: GlassShape, p: DiagramPrediction, show: DiagramShow, label: string): string {
  const where = `${label}: in the ${glass.name.toLowerCase()},`
  const around = aroundText(p)
  const tears = around ? ` ${around} tears around the glass,` : ''
  switch (show) {
    case 'band':
      return `${where} a clear band ${bandText(p)} up the wall from the liquid line, with${tears ? tears.replace(/,$/, '') : ' tears'} sliding back at ${speedText(p)}.`
    case 'swirl':
      return `${where} the band stays low (${bandText(p)}, inside the curve of the liquid's edge), but the film a swirl leaves on the glass runs down as legs at ${speedText(p)}.`
    case 'foam':
      return `${where} rings of foam are left on the glass as the level drops, and no tears.`
    default:
      return p.clearBandHeight_mm > 0
        ? `${where} no clear band and no distinct tears: the film's pull is too small to move the surface.`
        : `${where} no climbing film or tears are expected.`
  }
}

/** A teardrop hanging from (x, top): `w` wide, `len` long. */
function tearPath(x: number, top: number, w: number, len: number): string {
  const h = w / 2
  const bulbY = top + len - h
  return `M${pt(x, top)}C${pt(x + h * 0.3, top + len * 0.35)} ${pt(x + h, bulbY - h)} ${pt(x + h, bulbY)}`
    + `C${pt(x + h, bulbY + h * 1.33)} ${pt(x - h, bulbY + h * 1.33)} ${pt(x - h, bulbY)}C${pt(x - h, bulbY - h)} ${pt(x - h * 0.3, top + len * 0.35)} ${pt(x, top)}Z`
}

/**
 * The drawing of one pour in its glass. The liquid line is y = 0 (y grows downward, as in SVG);
 * every coordinate is rounded to 0.1 mm and every stroke width to 0.01 mm.
 */
export function glassDrawing(input: GlassDrawingInput): GlassDrawing {
  const { glass, prediction: p, palette, labels } = input
  const c = PALETTES[palette]
  const liquid = LIQUID_COLOUR_FILL[input.colour]
  const show = diagramShow(p)
  const r = glass.bowlDiameterMm / 2
  const fill = glass.fillHeightMm
  const wall = (glass.wallAngleDeg * Math.PI) / 180
  const sinW = Math.sin(wall)
  const cosW = Math.cos(wall)
  const lean = cosW / sinW // mm inward per mm up

  // Lengths along the wall, mm.
  const bandRange = p.ranges?.clearBandHeight_mm ?? null
  const band = show === 'band'
    ? Math.min(Math.max(p.clearBandHeight_mm, 0), BAND_MAX_MM)
    : show === 'swirl' ? Math.min(Math.max(p.clearBandHeight_mm, LOW_BAND_MIN_MM), BAND_MAX_MM) : 0
  const reach = Math.max(band, show === 'band' || show === 'swirl' ? Math.min(bandRange?.high ?? 0, BAND_MAX_MM) : 0, show === 'swirl' ? SWIRL_WALL_MM : 0, show === 'foam' ? 15 : 0)
  const scaleLen = Math.max(10, Math.ceil((reach + 2) / 5) * 5)
  // The rim: above the scale's top, but the bowl never narrows below 45 % of its width.
  const rimUp = Math.min((scaleLen + 4) * sinW, (0.55 * r) / Math.max(lean, 1e-6))
  const cx = r

  const xAt = (y: number, side: -1 | 1) => {
    if (y >= 0) {
      const t = Math.min(1, y / fill)
      return cx + side * r * Math.sqrt(Math.max(0, 1 - t * t * 0.92))
    }
    return cx + side * (r - -y * lean)
  }
  const items: DrawItem[] = []
  const bottom: string[] = []
  const steps = 8
  for (let i = 0; i <= steps; i++) bottom.push(pt(xAt((fill * i) / steps, -1), (fill * i) / steps))
  for (let i = steps; i >= 0; i--) bottom.push(pt(xAt((fill * i) / steps, 1), (fill * i) / steps))

  // The liquid, in its colour, and its surface.
  items.push({ kind: 'path', d: `M${bottom.join('L')}Z`, fill: liquid.hex, fillOpacity: liquid.opacity, role: 'liquid' })
  items.push({ kind: 'line', x1: r1(xAt(0, -1)), y1: 0, x2: r1(xAt(0, 1)), y2: 0, stroke: c.glass, strokeWidth: 0.35, role: 'surface' })

  const frontFace = (fromY: number, toY: number) => `M${pt(xAt(fromY, -1), fromY)}L${pt(xAt(toY, -1), toY)}L${pt(xAt(toY, 1), toY)}L${pt(xAt(fromY, 1), fromY)}Z`
  const across = (y: number) => ({ x1: r1(xAt(y, -1)), y1: r1(y), x2: r1(xAt(y, 1)), y2: r1(y) })
  const topY = -band * sinW
  const stroke = r2(Math.max(0.6, glass.bowlDiameterMm / 90))
  let drawnTears = 0
  let drawnSpacing: number | null = null
  const hangTears = (fromY: number, maxLen: number) => {
    const rHere = r - -fromY * lean
    const n = frontTears(p, Math.PI * rHere)
    const w = Math.max(0.6, Math.min(p.tearWidth_mm ?? 2, 8))
    drawnTears = n
    drawnSpacing = r1((Math.PI * rHere) / n)
    for (let i = 0; i < n; i++) {
      const phi = ((i + 0.5) * Math.PI) / n
      const x = cx - rHere * Math.cos(phi)
      const wi = w * Math.max(0.45, Math.sin(phi))
      const len = Math.max(w * 1.6, maxLen * (0.45 + 0.45 * ((i * 0.618) % 1)))
      items.push({ kind: 'path', d: tearPath(x, fromY, wi, len), fill: liquid.hex, fillOpacity: Math.max(0.8, liquid.opacity), stroke: c.tearEdge, strokeWidth: 0.2, role: 'tear' })
    }
  }

  if (show === 'band' && band > 0) {
    items.push({ kind: 'path', d: frontFace(0, topY), fill: c.film, fillOpacity: 0.3, role: 'film' })
    items.push({ kind: 'line', ...across(topY), stroke: c.ridge, strokeWidth: r2(stroke * 1.4), role: 'ridge' })
    if (p.tearWidth_mm) hangTears(topY, band * sinW * 0.8)
  }
  if (show === 'swirl') {
    const swirlY = -SWIRL_WALL_MM * sinW
    items.push({ kind: 'path', d: frontFace(topY, swirlY), fill: c.film, fillOpacity: 0.14, role: 'curtain' })
    items.push({ kind: 'path', d: frontFace(0, topY), fill: c.film, fillOpacity: 0.35, role: 'film' })
    items.push({ kind: 'line', ...across(topY), stroke: c.ridge, strokeWidth: r2(stroke), role: 'ridge' })
    items.push({ kind: 'line', ...across(swirlY), stroke: c.ridge, strokeWidth: r2(stroke * 1.2), dash: '2.4 1.4', role: 'swirl-line' })
    hangTears(swirlY, (topY - swirlY) * 0.85)
  }
  if (show === 'foam') {
    for (const up of [5, 10, 15]) {
      const y = -up * sinW
      items.push({ kind: 'line', ...across(y), stroke: c.foam, strokeWidth: r2(stroke * 1.3), dash: '1.2 0.9', role: 'foam' })
    }
  }

  // The glass: wall from rim to liquid line, the rounded bowl below.
  const rimY = -rimUp
  items.push({ kind: 'path', d: `M${pt(xAt(rimY, -1), rimY)}L${bottom.join('L')}L${pt(xAt(rimY, 1), rimY)}`, fill: 'none', stroke: c.glass, strokeWidth: stroke, role: 'glass' })

  // The millimetre scale, parallel to the right wall, 0 at the liquid line.
  const ux = -cosW
  const uy = -sinW
  const nx = sinW // outward normal
  const ny = -cosW
  const gap = 3.2
  const x0 = xAt(0, 1) + gap * nx
  const y0 = gap * ny
  const at = (s: number, out: number) => ({ x: x0 + s * ux + out * nx, y: y0 + s * uy + out * ny })
  const shown = Math.min(scaleLen, rimUp / sinW)
  const end = at(shown, 0)
  items.push({ kind: 'line', x1: r1(x0), y1: r1(y0), x2: r1(end.x), y2: r1(end.y), stroke: c.soft, strokeWidth: 0.3, role: 'scale' })
  const numberEvery = shown >= 20 ? 10 : 5
  let minor = ''
  let major = ''
  for (let s = 0; s <= shown + 1e-9; s += 1) {
    const a = at(s, 0)
    const isMajor = s % 5 === 0
    if (!labels && !isMajor) continue
    const b = at(s, isMajor ? 2.2 : 1.2)
    const seg = `M${pt(a.x, a.y)}L${pt(b.x, b.y)}`
    if (isMajor) major += seg
    else minor += seg
  }
  if (minor) items.push({ kind: 'path', d: minor, stroke: c.soft, strokeWidth: 0.18, role: 'scale-ticks' })
  items.push({ kind: 'path', d: major, stroke: c.soft, strokeWidth: 0.3, role: 'scale-major' })
  let numbersRight = at(0, 2.2).x
  if (labels) {
    const last = Math.floor(shown / numberEvery) * numberEvery
    for (let s = 0; s <= last; s += numberEvery) {
      const q = at(s, 3)
      const text = s === last ? `${s} mm` : String(s)
      items.push({ kind: 'text', x: r1(q.x), y: r1(q.y + NUMBER_MM * 0.35), text, size: NUMBER_MM, fill: c.soft, anchor: 'start', role: 'scale-number' })
      numbersRight = Math.max(numbersRight, q.x + text.length * NUMBER_MM * CHAR_EM)
    }
  }

  // The band's range as a shaded span between the wall and the scale, with the band's top across it.
  if ((show === 'band' || show === 'swirl') && band > 0) {
    const lo = Math.min(bandRange?.low ?? band, shown)
    const hi = Math.min(bandRange?.high ?? band, shown)
    const a = at(lo, -0.4)
    const b = at(hi, -0.4)
    const a2 = at(lo, -2.2)
    const b2 = at(hi, -2.2)
    items.push({ kind: 'path', d: `M${pt(a.x, a.y)}L${pt(b.x, b.y)}L${pt(b2.x, b2.y)}L${pt(a2.x, a2.y)}Z`, fill: c.range, fillOpacity: 0.35, stroke: c.range, strokeWidth: 0.3, role: 'range' })
    const m = at(Math.min(band, shown), 2.2)
    items.push({ kind: 'line', x1: r1(xAt(topY, 1)), y1: r1(topY), x2: r1(m.x), y2: r1(m.y), stroke: c.ridge, strokeWidth: 0.5, role: 'band-mark' })
  }

  // Labels to the right of the scale, pushed apart so that none overlaps the next.
  if (labels) {
    const wanted: { lines: string[], y: number }[] = [{ lines: ['liquid line'], y: 0 }]
    const around = aroundText(p)
    if (show === 'band') {
      wanted.push({ lines: ['clear band', bandText(p)], y: topY })
      if (drawnTears && around) wanted.push({ lines: [`${around} tears`, 'around the glass'], y: topY * 0.45 })
    }
    if (show === 'swirl') {
      wanted.push({ lines: ['low band', bandText(p)], y: topY })
      wanted.push({ lines: ['legs run from', 'the swirl line'], y: -SWIRL_WALL_MM * sinW })
    }
    if (show === 'foam') wanted.push({ lines: ['foam rings,', 'no tears'], y: -10 * sinW })
    if (show === 'none') wanted.push({ lines: ['no clear band,', 'no tears'], y: -10 * sinW })
    const lineH = LABEL_MM * 1.2
    const gapY = LABEL_MM * 0.4
    const labelX = numbersRight + 3
    let limit = Number.POSITIVE_INFINITY
    for (const w of [...wanted].sort((a, b) => b.y - a.y)) {
      const h = w.lines.length * lineH
      const top = Math.min(w.y - h / 2, limit - gapY - h)
      limit = top
      const s = Math.max(0, Math.min(shown, -w.y / sinW))
      const from = at(s, 2.6)
      items.push({ kind: 'line', x1: r1(from.x), y1: r1(from.y), x2: r1(labelX - 0.8), y2: r1(top + h / 2), stroke: c.soft, strokeWidth: 0.2, dash: '0.8 0.6', role: 'leader' })
      w.lines.forEach((line, i) => {
        items.push({ kind: 'text', x: r1(labelX), y: r1(top + LABEL_MM * 0.9 + i * lineH), text: line, size: LABEL_MM, fill: c.ink, anchor: 'start', weight: i === 0 ? 'semibold' : 'regular', role: 'label' })
      })
    }
  }

  return {
    viewBox: boxOf(items),
    items,
    description: describe(glass, p, show, input.label),
    show,
    scale: { x0: r2(x0), y0: r2(y0), ux: r2(ux), uy: r2(uy), lengthMm: shown },
    tears: { drawn: drawnTears, spacingMm: drawnSpacing },
  }
}

/** Estimated width of a text item, mm (CHAR_EM per character; semibold a little wider). */
export function textWidth(t: Extract<DrawItem, { kind: 'text' }>): number {
  return t.text.length * t.size * CHAR_EM * (t.weight === 'semibold' ? 1.06 : 1)
}

/** The box around every item (text by its estimated width), with a small margin. */
function boxOf(items: DrawItem[]): GlassDrawing['viewBox'] {
  let x0 = Infinity
  let y0 = Infinity
  let x1 = -Infinity
  let y1 = -Infinity
  const add = (x: number, y: number) => {
    x0 = Math.min(x0, x)
    y0 = Math.min(y0, y)
    x1 = Math.max(x1, x)
    y1 = Math.max(y1, y)
  }
  for (const it of items) {
    if (it.kind === 'line') {
      add(it.x1, it.y1)
      add(it.x2, it.y2)
    }
    else if (it.kind === 'ellipse') {
      add(it.cx - it.rx, it.cy - it.ry)
      add(it.cx + it.rx, it.cy + it.ry)
    }
    else if (it.kind === 'text') {
      const w = textWidth(it)
      const left = it.anchor === 'start' ? it.x : it.anchor === 'middle' ? it.x - w / 2 : it.x - w
      add(left, it.y - it.size)
      add(left + w, it.y + it.size * 0.3)
    }
    else {
      const nums = it.d.match(/-?\d+(?:\.\d+)?/g)?.map(Number) ?? []
      // Paths here use M, L, C and Z only: every number pairs with the next as a point, and a
      // curve stays inside the box of its control points.
      for (let i = 0; i + 1 < nums.length; i += 2) add(nums[i]!, nums[i + 1]!)
    }
  }
  const m = 1.5
  const x = Math.floor((x0 - m) * 10) / 10
  const y = Math.floor((y0 - m) * 10) / 10
  return { x, y, width: r1(Math.ceil((x1 + m) * 10) / 10 - x), height: r1(Math.ceil((y1 + m) * 10) / 10 - y) }
}

const esc = (s: string) => s.replace(/&/g, '&amp;').replace(/</g, '&lt;').replace(/>/g, '&gt;').replace(/"/g, '&quot;')

/** SVG attributes of one item, as name → value (shared by glassDrawingSvg and the Vue component). */
export function drawAttrs(it: DrawItem): Record<string, string | number> {
  switch (it.kind) {
    case 'path':
      return {
        d: it.d, fill: it.fill ?? 'none',
        ...(it.fillOpacity !== undefined ? { 'fill-opacity': it.fillOpacity } : {}),
        ...(it.stroke ? { 'stroke': it.stroke, 'stroke-width': it.strokeWidth ?? 0.3, 'stroke-linejoin': 'round' } : {}),
        ...(it.dash ? { 'stroke-dasharray': it.dash } : {}),
      }
    case 'ellipse':
      return { cx: it.cx, cy: it.cy, rx: it.rx, ry: it.ry, fill: it.fill, ...(it.fillOpacity !== undefined ? { 'fill-opacity': it.fillOpacity } : {}) }
    case 'line':
      return { 'x1': it.x1, 'y1': it.y1, 'x2': it.x2, 'y2': it.y2, 'stroke': it.stroke, 'stroke-width': it.strokeWidth, 'stroke-linecap': 'round', ...(it.dash ? { 'stroke-dasharray': it.dash } : {}) }
    case 'text':
      return { 'x': it.x, 'y': it.y, 'font-size': it.size, 'fill': it.fill, 'text-anchor': it.anchor, ...(it.weight === 'semibold' ? { 'font-weight': 600 } : {}) }
  }
}

export function viewBoxText(v: GlassDrawing['viewBox']): string {
  return `${v.x} ${v.y} ${v.width} ${v.height}`
}

/** The drawing as a standalone SVG document (tests, server use); text in a generic sans-serif. */
export function glassDrawingSvg(drawing: GlassDrawing, opts: { title?: string, titleId?: string, widthPx?: number } = {}): string {
  const v = drawing.viewBox
  const size = opts.widthPx ? ` width="${opts.widthPx}" height="${Math.round((opts.widthPx * v.height) / v.width)}"` : ''
  const label = opts.titleId ? ` aria-labelledby="${esc(opts.titleId)}"` : ''
  const title = `<title${opts.titleId ? ` id="${esc(opts.titleId)}"` : ''}>${esc(opts.title ?? drawing.description)}</title>`
  const body = drawing.items.map((it) => {
    const attrs = Object.entries(drawAttrs(it)).map(([k, val]) => ` ${k}="${esc(String(val))}"`).join('')
    return it.kind === 'text' ? `<text${attrs}>${esc(it.text)}</text>` : `<${it.kind}${attrs}/>`
  }).join('')
  return `<svg xmlns="http://www.w3.org/2000/svg" viewBox="${viewBoxText(v)}"${size} role="img"${label} font-family="sans-serif" data-show="${drawing.show}">${title}${body}</svg>`
}
