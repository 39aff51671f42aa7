/**
 * Film activity index, 0–10, second edition: a physical quantity on a guest's scale.
 *
 * The index is the Marangoni volume flux that the climbing film carries up the wall per unit
 * length of the liquid line, q = τ³/(6 μ (ρ g sinβ)²) (climbingFilm.ts: the liquid that feeds the
 * ridge and leaves as tears), divided by its anchor and scaled to 10:
 *   index = min(10, 10 · q / q_ref),
 * q_ref = the largest q of any water–ethanol mixture (no sugar) at 20 °C in the default room
 * (50 % RH, 21 °C air, 0.1 m/s draughts) on the default 70° wall (INDEX_REFERENCE). It is 0 at
 * 0 % vol (no solutal drive), rises steeply over the first per cent of alcohol and peaks in the
 * table-wine range; above it the stronger pull of a spirit is offset by its viscosity, so q falls
 * slowly and stays within about a quarter of the peak up to 95 % vol (docs/science.md).
 * Sugar lowers it weakly (q ∝ μ^(−1/4) at a given drive); warm pours and dry rooms raise it.
 */

/**
 * Anchor of the scale: the largest climbing flux q over 0–100 % vol, mm²/s, and where it lies,
 * at 20 °C liquid in the default room on the default glass. Recomputed by findIndexReference()
 * in the unit tests.
 */
export const INDEX_REFERENCE = { climbFlux_mm2_s: 0.025882684714539254, abvPctVol: 11.49, tempC: 20 } as const

/** The index from a climbing flux (mm²/s): min(10, 10 q/q_ref), never negative. */
export function indexFromClimbFlux(climbFlux_mm2_s: number): { index: number, relative: number } {
  const relative = Math.max(0, climbFlux_mm2_s) / INDEX_REFERENCE.climbFlux_mm2_s
  return { index: Math.min(10, 10 * relative), relative }
}
