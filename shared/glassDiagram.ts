/** A glass's shape: bowl diameter and fill height in mm, wall angle in degrees from horizontal. */
export interface GlassShape { name: string, bowlDiameterMm: number, wallAngleDeg: number, fillHeightMm: number }
/** The prediction fields the diagram draws (from the glass model's TearPrediction). */
export interface DiagramPrediction {
  tearsExpected: boolean
  clearBandHeight_mm: number
  meniscusHeight_mm: number
  tearWidth_mm: number | null
  tearFallSpeed_mm_s: number | null
}

/**
 * Geometry of the glass diagram in millimetres (the SVG's own units). The bowl is a rounded cup
 * whose wall, from the wine line up, leans at the glass's wall angle; the band is drawn along
 * the wall for its predicted length, and tears are spaced about three tear widths apart.
 */
export function glassDiagramGeometry(glass: GlassShape, p: DiagramPrediction) {
  const r = glass.bowlDiameterMm / 2
  const fill = glass.fillHeightMm
  const band = p.tearsExpected || p.clearBandHeight_mm > 0 ? Math.min(p.clearBandHeight_mm, 60) : 0
  const above = Math.max(band + 14, 24)
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
    // Below the wine line: a rounded bottom; above: straight wall leaning by `lean`.
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
  let bandShapes = null
  const tears: { x: number, y: number, rx: number, ry: number }[] = []
  if (band > 0) {
    const topY = fillY - band * Math.sin((glass.wallAngleDeg * Math.PI) / 180)
    const strip = (side: -1 | 1) => `M${xAt(fillY, side)},${fillY} L${xAt(topY, side)},${topY} L${xAt(topY, side) - side * film},${topY} L${xAt(fillY, side) - side * film},${fillY} Z`
    bandShapes = {
      left: strip(-1),
      right: strip(1),
      ridge: { y: topY, y2: topY + 0.01, leftX1: xAt(topY, -1), leftX2: xAt(topY, -1) + 2 * film, rightX1: xAt(topY, 1), rightX2: xAt(topY, 1) - 2 * film },
    }
    if (p.tearsExpected && p.tearWidth_mm) {
      const w = p.tearWidth_mm
      const count = Math.max(1, Math.min(4, Math.floor(band / (3 * w))))
      for (let i = 0; i < count; i++) {
        const y = topY + (i + 0.7) * (band / (count + 0.5))
        const rx = Math.max(2.2, Math.min(w * 0.7, 3.2))
        const ry = Math.max(3.4, Math.min(w * 1.3, 5.5))
        tears.push({ x: xAt(y, -1) + film * 0.9, y, rx, ry })
        tears.push({ x: xAt(y, 1) - film * 0.9, y: y + band / (count * 2.5), rx, ry })
      }
    }
  }

  return {
    viewBox: `0 0 ${width.toFixed(1)} ${(bottomY + margin).toFixed(1)}`,
    outline,
    liquidPath,
    band: bandShapes,
    tears,
    stroke,
    fillY,
    labelX: cx + r + 3,
    font: Math.max(4.5, glass.bowlDiameterMm / 12),
    description(label: string) {
      if (!p.tearsExpected && band <= 0) return `${label}: in the ${glass.name.toLowerCase()}, no climbing film or tears are expected.`
      if (!p.tearsExpected) return `${label}: in the ${glass.name.toLowerCase()}, a faint film a few millimetres high may form, with no distinct tears.`
      const speed = p.tearFallSpeed_mm_s ?? 0
      return `${label}: in the ${glass.name.toLowerCase()}, a clear band about ${p.clearBandHeight_mm.toFixed(0)} mm high above the wine, with tears about ${(p.tearWidth_mm ?? 0).toFixed(1)} mm wide sliding back at about ${speed.toFixed(speed < 1 ? 2 : 1)} mm/s.`
    },
  }
}
