/**
 * The demo's photos, drawn for Larmoir as SVG and rendered to JPEG when the demo is loaded
 * (server/utils/demoContent.ts): the tasting bar for the home page, and each product's bottle
 * beside its glass. Flat shapes only, no text (the server may have no fonts), no outside images.
 */

type BottleShape = 'cider' | 'sparkling' | 'slender' | 'shouldered' | 'squat' | 'square'
type GlassShape = 'tumbler' | 'flute' | 'tulip' | 'nosing'

interface ProductLook {
  backdrop: [string, string]
  bottle: BottleShape
  glassColor: string
  label: string
  liquid: string
  glass: GlassShape
  /** The bottle's cap or foil. */
  top: string
}

/** How each demo product is drawn, by product code (server/demo/data.ts). */
const LOOKS: Record<string, ProductLook> = {
  'SV-CID-21': { backdrop: ['#f1e7d3', '#dccbab'], bottle: 'cider', glassColor: '#6b3f1d', label: '#f7efdc', liquid: '#e6bc55', glass: 'tumbler', top: '#c98a2b' },
  'SV-SPK-22': { backdrop: ['#e9eee9', '#c9d6cf'], bottle: 'sparkling', glassColor: '#1f3b2c', label: '#faf7f1', liquid: '#efd98a', glass: 'flute', top: '#d4a63c' },
  'SV-ALB-24': { backdrop: ['#eef3f2', '#cfe0dd'], bottle: 'slender', glassColor: '#9fbf8a', label: '#fbf8ef', liquid: '#f0e6a8', glass: 'tulip', top: '#25665f' },
  'SV-CF-23': { backdrop: ['#f4e9e4', '#e0c9bf'], bottle: 'shouldered', glassColor: '#2a1d1f', label: '#c8694a', liquid: '#7a1f2b', glass: 'tulip', top: '#4a1c22' },
  'SV-FOR-19': { backdrop: ['#efe4dc', '#d6bfae'], bottle: 'squat', glassColor: '#311318', label: '#e9d9b8', liquid: '#4e0f1c', glass: 'nosing', top: '#8a5a12' },
  'SV-GIN-07': { backdrop: ['#e6f0ef', '#c3dbd7'], bottle: 'square', glassColor: '#d9ebe7', label: '#2f7d74', liquid: '#eef6f4', glass: 'nosing', top: '#8a5a2b' },
}

/** The demo products that have a drawing. */
export const DRAWN_PRODUCTS = Object.keys(LOOKS)

const BOTTLES: Record<BottleShape, { w: number, h: number, shoulder: number, neckW: number, neckH: number, corner: number }> = {
  cider: { w: 190, h: 380, shoulder: 120, neckW: 54, neckH: 130, corner: 26 },
  sparkling: { w: 230, h: 360, shoulder: 170, neckW: 62, neckH: 120, corner: 34 },
  slender: { w: 160, h: 430, shoulder: 190, neckW: 48, neckH: 120, corner: 20 },
  shouldered: { w: 200, h: 420, shoulder: 60, neckW: 52, neckH: 150, corner: 18 },
  squat: { w: 250, h: 240, shoulder: 90, neckW: 58, neckH: 110, corner: 70 },
  square: { w: 220, h: 380, shoulder: 30, neckW: 70, neckH: 60, corner: 12 },
}

/** A bottle standing on `baseY`, centred on `cx`: body, shoulder curve, neck and lip. */
function bottlePath(shape: BottleShape, cx: number, baseY: number): { d: string, bodyTop: number, neckTop: number, w: number } {
  const b = BOTTLES[shape]
  const l = cx - b.w / 2
  const r = cx + b.w / 2
  const bodyTop = baseY - b.h
  const shoulderTop = bodyTop - b.shoulder
  const neckTop = shoulderTop - b.neckH
  const nl = cx - b.neckW / 2
  const nr = cx + b.neckW / 2
  const c = b.corner
  const d = [
    `M ${l + c} ${baseY}`,
    `L ${r - c} ${baseY}`,
    `Q ${r} ${baseY} ${r} ${baseY - c}`,
    `L ${r} ${bodyTop}`,
    `C ${r} ${bodyTop - b.shoulder * 0.6} ${nr} ${shoulderTop + b.shoulder * 0.35} ${nr} ${shoulderTop}`,
    `L ${nr} ${neckTop + 10}`,
    `L ${nr + 6} ${neckTop + 4}`,
    `L ${nr + 6} ${neckTop}`,
    `L ${nl - 6} ${neckTop}`,
    `L ${nl - 6} ${neckTop + 4}`,
    `L ${nl} ${neckTop + 10}`,
    `L ${nl} ${shoulderTop}`,
    `C ${nl} ${shoulderTop + b.shoulder * 0.35} ${l} ${bodyTop - b.shoulder * 0.6} ${l} ${bodyTop}`,
    `L ${l} ${baseY - c}`,
    `Q ${l} ${baseY} ${l + c} ${baseY}`,
    'Z',
  ].join(' ')
  return { d, bodyTop, neckTop, w: b.w }
}

/** A glass on `baseY` centred on `cx`, `scale` 1 ≈ a tulip 300 px tall; its outline and the liquid in it. */
function glassShapes(shape: GlassShape, cx: number, baseY: number, liquid: string, scale = 1): string {
  const s = (n: number) => n * scale
  const stroke = `stroke="#ffffff" stroke-opacity="0.85" stroke-width="${s(5)}" fill="#ffffff" fill-opacity="0.18"`
  if (shape === 'tumbler') {
    const top = baseY - s(190)
    return `<path d="M ${cx - s(78)} ${top} L ${cx - s(64)} ${baseY} L ${cx + s(64)} ${baseY} L ${cx + s(78)} ${top}" ${stroke} stroke-linejoin="round"/>
      <path d="M ${cx - s(72)} ${baseY - s(110)} L ${cx - s(65)} ${baseY - s(8)} L ${cx + s(65)} ${baseY - s(8)} L ${cx + s(72)} ${baseY - s(110)} Z" fill="${liquid}" opacity="0.9"/>`
  }
  if (shape === 'flute') {
    const top = baseY - s(330)
    const bowlBottom = baseY - s(120)
    return `<path d="M ${cx - s(38)} ${top} C ${cx - s(40)} ${bowlBottom - s(40)} ${cx - s(20)} ${bowlBottom} ${cx} ${bowlBottom} C ${cx + s(20)} ${bowlBottom} ${cx + s(40)} ${bowlBottom - s(40)} ${cx + s(38)} ${top}" ${stroke}/>
      <path d="M ${cx - s(36)} ${top + s(60)} C ${cx - s(38)} ${bowlBottom - s(40)} ${cx - s(18)} ${bowlBottom - s(4)} ${cx} ${bowlBottom - s(4)} C ${cx + s(18)} ${bowlBottom - s(4)} ${cx + s(38)} ${bowlBottom - s(40)} ${cx + s(36)} ${top + s(60)} Z" fill="${liquid}" opacity="0.9"/>
      <path d="M ${cx} ${bowlBottom} L ${cx} ${baseY} M ${cx - s(48)} ${baseY} L ${cx + s(48)} ${baseY}" stroke="#ffffff" stroke-opacity="0.85" stroke-width="${s(6)}" stroke-linecap="round"/>`
  }
  const tall = shape === 'tulip' ? 1 : 0.72
  const top = baseY - s(300 * tall)
  const bowlBottom = baseY - s(120 * tall)
  const half = s((shape === 'tulip' ? 82 : 62))
  const lip = half * 0.72
  const fill = bowlBottom - s(70 * tall)
  return `<path d="M ${cx - lip} ${top} C ${cx - half * 1.25} ${fill} ${cx - half} ${bowlBottom} ${cx} ${bowlBottom} C ${cx + half} ${bowlBottom} ${cx + half * 1.25} ${fill} ${cx + lip} ${top}" ${stroke}/>
    <path d="M ${cx - half * 0.98} ${fill} C ${cx - half * 0.9} ${bowlBottom - s(4)} ${cx - half * 0.4} ${bowlBottom - s(4)} ${cx} ${bowlBottom - s(4)} C ${cx + half * 0.4} ${bowlBottom - s(4)} ${cx + half * 0.9} ${bowlBottom - s(4)} ${cx + half * 0.98} ${fill} Z" fill="${liquid}" opacity="0.92"/>
    <path d="M ${cx} ${bowlBottom} L ${cx} ${baseY} M ${cx - s(58 * tall)} ${baseY} L ${cx + s(58 * tall)} ${baseY}" stroke="#ffffff" stroke-opacity="0.85" stroke-width="${s(6)}" stroke-linecap="round"/>`
}

/** A product's bottle beside its glass, 800 × 1000 px. */
export function productPicture(code: string): string {
  const look = LOOKS[code]
  if (!look) throw new Error(`no drawing for ${code}`)
  const baseY = 860
  const bottle = bottlePath(look.bottle, 330, baseY)
  const labelH = Math.min(150, (baseY - bottle.bodyTop) * 0.55)
  const labelY = bottle.bodyTop + (baseY - bottle.bodyTop - labelH) * 0.45
  const labelW = bottle.w - 36
  return `<svg xmlns="http://www.w3.org/2000/svg" width="800" height="1000" viewBox="0 0 800 1000">
  <defs>
    <linearGradient id="wall" x1="0" y1="0" x2="0" y2="1"><stop offset="0" stop-color="${look.backdrop[0]}"/><stop offset="1" stop-color="${look.backdrop[1]}"/></linearGradient>
    <linearGradient id="table" x1="0" y1="0" x2="0" y2="1"><stop offset="0" stop-color="#9a6a3d"/><stop offset="1" stop-color="#6e4524"/></linearGradient>
    <linearGradient id="sheen" x1="0" y1="0" x2="1" y2="0"><stop offset="0" stop-color="#ffffff" stop-opacity="0"/><stop offset="0.5" stop-color="#ffffff" stop-opacity="0.28"/><stop offset="1" stop-color="#ffffff" stop-opacity="0"/></linearGradient>
  </defs>
  <rect width="800" height="1000" fill="url(#wall)"/>
  <circle cx="640" cy="190" r="220" fill="#ffffff" opacity="0.35"/>
  <rect y="${baseY - 6}" width="800" height="${1000 - baseY + 6}" fill="url(#table)"/>
  <rect y="${baseY - 6}" width="800" height="8" fill="#b88756"/>
  <ellipse cx="330" cy="${baseY + 4}" rx="${bottle.w * 0.62}" ry="14" fill="#3c2412" opacity="0.35"/>
  <path d="${bottle.d}" fill="${look.glassColor}"/>
  <rect x="${330 - bottle.w / 2 + 14}" y="${bottle.bodyTop + 10}" width="26" height="${baseY - bottle.bodyTop - 40}" rx="13" fill="url(#sheen)"/>
  <rect x="${330 - 32}" y="${bottle.neckTop - 6}" width="64" height="70" rx="6" fill="${look.top}"/>
  <rect x="${330 - labelW / 2}" y="${labelY}" width="${labelW}" height="${labelH}" rx="8" fill="${look.label}"/>
  <rect x="${330 - labelW / 2 + 22}" y="${labelY + labelH * 0.3}" width="${labelW - 44}" height="10" rx="5" fill="${look.glassColor}" opacity="0.55"/>
  <rect x="${330 - labelW / 2 + 40}" y="${labelY + labelH * 0.55}" width="${labelW - 80}" height="8" rx="4" fill="${look.glassColor}" opacity="0.35"/>
  <ellipse cx="600" cy="${baseY + 4}" rx="90" ry="10" fill="#3c2412" opacity="0.3"/>
  ${glassShapes(look.glass, 600, baseY, look.liquid)}
</svg>`
}

/** The flight's six colours, lightest to strongest, for the row of glasses on the bar. */
const ROW = ['#e6bc55', '#efd98a', '#f0e6a8', '#7a1f2b', '#4e0f1c', '#eef6f4']

/** The tasting bar at dusk, 1600 × 1000 px: the marsh through the window, six glasses and their cards. */
export function roomPicture(): string {
  const glasses = ROW.map((liquid, i) => {
    const cx = 300 + i * 200
    return `<rect x="${cx - 62}" y="842" width="124" height="74" rx="4" fill="#faf7f1" transform="rotate(${(i % 2 ? 2 : -2)} ${cx} 880)"/>
    <rect x="${cx - 44}" y="862" width="88" height="7" rx="3" fill="#4a5459" opacity="0.5" transform="rotate(${(i % 2 ? 2 : -2)} ${cx} 880)"/>
    <rect x="${cx - 44}" y="880" width="60" height="6" rx="3" fill="#4a5459" opacity="0.3" transform="rotate(${(i % 2 ? 2 : -2)} ${cx} 880)"/>
    <ellipse cx="${cx}" cy="${800 + 4}" rx="64" ry="9" fill="#2a170a" opacity="0.35"/>
    ${glassShapes('tulip', cx, 800, liquid, 0.95)}`
  }).join('\n')
  return `<svg xmlns="http://www.w3.org/2000/svg" width="1600" height="1000" viewBox="0 0 1600 1000">
  <defs>
    <linearGradient id="sky" x1="0" y1="0" x2="0" y2="1"><stop offset="0" stop-color="#3f6f78"/><stop offset="0.55" stop-color="#e7a86b"/><stop offset="1" stop-color="#f6d8a4"/></linearGradient>
    <linearGradient id="bar" x1="0" y1="0" x2="0" y2="1"><stop offset="0" stop-color="#8c5a30"/><stop offset="1" stop-color="#4f3019"/></linearGradient>
    <linearGradient id="water" x1="0" y1="0" x2="0" y2="1"><stop offset="0" stop-color="#f2c993"/><stop offset="1" stop-color="#7fa9a6"/></linearGradient>
  </defs>
  <rect width="1600" height="1000" fill="#e9dcc4"/>
  <rect x="120" y="70" width="1360" height="560" rx="10" fill="url(#sky)"/>
  <circle cx="1130" cy="430" r="70" fill="#fbe3b4" opacity="0.9"/>
  <path d="M 120 470 Q 420 430 760 462 T 1480 448 L 1480 630 L 120 630 Z" fill="#5f6f46"/>
  <path d="M 120 520 Q 500 500 900 520 T 1480 510 L 1480 560 L 120 560 Z" fill="url(#water)"/>
  <path d="M 120 555 Q 520 540 980 560 T 1480 552 L 1480 630 L 120 630 Z" fill="#7c8a52"/>
  <g stroke="#4e5b37" stroke-width="4" stroke-linecap="round">
    <path d="M 200 630 l -8 -70 M 232 630 l 6 -82 M 262 630 l -3 -64 M 1320 630 l 5 -76 M 1352 630 l -6 -60 M 1390 630 l 2 -88"/>
  </g>
  <g fill="#2e3a38">
    <path d="M 430 512 q 10 -40 22 -58 q 6 -12 18 -10 q 8 2 4 10 q -14 4 -18 22 q 26 4 30 30 q -26 10 -50 8 Z"/>
    <path d="M 452 516 l -4 34 M 460 516 l 4 34" stroke="#2e3a38" stroke-width="3"/>
  </g>
  <g fill="none" stroke="#f4ead8" stroke-width="18">
    <rect x="120" y="70" width="1360" height="560" rx="10"/>
    <path d="M 573 70 V 630 M 1027 70 V 630"/>
  </g>
  <path d="M 800 0 V 120" stroke="#1e2326" stroke-width="4"/>
  <path d="M 740 170 Q 800 100 860 170 Z" fill="#25665f"/>
  <ellipse cx="800" cy="172" rx="26" ry="8" fill="#fbe3b4"/>
  <rect x="0" y="760" width="1600" height="240" fill="url(#bar)"/>
  <rect x="0" y="752" width="1600" height="20" fill="#a77446"/>
  ${glasses}
</svg>`
}
