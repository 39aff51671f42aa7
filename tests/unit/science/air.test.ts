import { describe, it, expect } from 'vitest'
import {
  airConductivity_W_m_K, airViscosity_Pa_s, diffusivityEthanolAir_m2_s, diffusivityWaterAirFuller_m2_s, diffusivityWaterAir_m2_s,
  forcedConvectionSherwood, moistAirDensity_kg_m3, naturalConvectionSherwood, wallTransfer,
} from '../../../shared/science/air'

const K = 273.15

describe('vapour diffusivities in air', () => {
  it('water: Massman (1998) Table 2 form, 2.178e-5 m²/s at 0 °C and 1 atm', () => {
    expect(diffusivityWaterAir_m2_s(K)).toBeCloseTo(2.178e-5, 9) // Massman, Atmos. Environ. 32, 1111 (1998)
    expect(diffusivityWaterAir_m2_s(25 + K) / 2.55e-5).toBeCloseTo(1, 2) // the same formula at 25 °C, evaluated by hand: 2.55e-5
  })

  it('Fuller–Schettler–Giddings agrees with Massman for water within 3 %', () => {
    for (const t of [0, 20, 40]) expect(diffusivityWaterAirFuller_m2_s(t + K) / diffusivityWaterAir_m2_s(t + K)).toBeGreaterThan(0.97)
    for (const t of [0, 20, 40]) expect(diffusivityWaterAirFuller_m2_s(t + K) / diffusivityWaterAir_m2_s(t + K)).toBeLessThan(1.03)
  })

  it('ethanol: Fuller gives ~1.2e-5 m²/s at 25 °C, half of water\'s', () => {
    const d = diffusivityEthanolAir_m2_s(25 + K)
    expect(d).toBeGreaterThan(1.15e-5) // measured ≈ 1.2e-5 m²/s (handbook tables — from memory)
    expect(d).toBeLessThan(1.3e-5)
    expect(d / diffusivityWaterAir_m2_s(25 + K)).toBeCloseTo(0.48, 1)
  })

  it('scales with pressure as 1/P', () => {
    expect(diffusivityWaterAir_m2_s(293.15, 50662.5) / diffusivityWaterAir_m2_s(293.15)).toBeCloseTo(2, 10)
    expect(diffusivityEthanolAir_m2_s(293.15, 50662.5) / diffusivityEthanolAir_m2_s(293.15)).toBeCloseTo(2, 10)
  })
})

describe('air properties', () => {
  it('Sutherland viscosity and conductivity at 20 °C', () => {
    expect(airViscosity_Pa_s(293.15)).toBeCloseTo(1.81e-5, 7) // handbook 1.81e-5 Pa·s (from memory)
    expect(airConductivity_W_m_K(293.15)).toBeCloseTo(0.0257, 3) // handbook 0.0257 W/(m·K) (from memory)
  })

  it('dry air at 20 °C and 1 atm: 1.204 kg/m³; water vapour makes it lighter, ethanol vapour heavier', () => {
    expect(moistAirDensity_kg_m3(293.15, 0, 0)).toBeCloseTo(1.204, 3) // ideal gas with M = 28.9645 g/mol (U.S. Standard Atmosphere 1976)
    expect(moistAirDensity_kg_m3(293.15, 0, 0.02)).toBeLessThan(moistAirDensity_kg_m3(293.15, 0, 0))
    expect(moistAirDensity_kg_m3(293.15, 0.02, 0)).toBeGreaterThan(moistAirDensity_kg_m3(293.15, 0, 0))
  })
})

describe('transfer coefficients of the wetted wall', () => {
  it('Churchill–Chu tends to 0.825² = 0.68 with no buoyancy and grows as Ra^(1/4)…Ra^(1/3)', () => {
    expect(naturalConvectionSherwood(0, 0.6)).toBeCloseTo(0.680625, 6) // Churchill & Chu (1975): (0.825)²
    const a = naturalConvectionSherwood(1e5, 0.7)
    const b = naturalConvectionSherwood(1e7, 0.7)
    expect(b / a).toBeGreaterThan(100 ** 0.25 * 0.9)
    expect(b / a).toBeLessThan(100 ** (1 / 3) * 1.1)
  })

  it('laminar flat plate: Sh = 0.664 Re^½ Sc^⅓', () => {
    expect(forcedConvectionSherwood(400, 1)).toBeCloseTo(0.664 * 20, 10) // Pohlhausen solution
  })

  it('gives still-room coefficients of a few mm/s, ethanol\'s below water\'s', () => {
    const t = wallTransfer({ surfaceT_K: 288.15, airT_K: 294.15, surfaceYEthanol: 0.02, surfaceYWater: 0.017, roomYWater: 0.012, motion: { airSpeed_m_s: 0.1, wallHeight_m: 0.04 } })
    // indoor evaporation from a wetted surface: k of order 1e-3–1e-2 m/s (common practice, no source)
    expect(t.kWater_m_s).toBeGreaterThan(1e-3)
    expect(t.kWater_m_s).toBeLessThan(1e-2)
    expect(t.kEthanol_m_s).toBeLessThan(t.kWater_m_s)
    expect(t.kEthanol_m_s / t.kWater_m_s).toBeGreaterThan(0.5) // (D_E/D_W)^(2/3…3/4) with D_E/D_W ≈ 0.48
    expect(t.hAir_W_m2_K).toBeGreaterThan(2) // natural convection in air: 2–25 W/(m²·K) (common practice, no source)
    expect(t.hAir_W_m2_K).toBeLessThan(25)
  })

  it('grows with the room\'s draughts', () => {
    const base = { surfaceT_K: 293.15, airT_K: 293.15, surfaceYEthanol: 0.01, surfaceYWater: 0.02, roomYWater: 0.012 }
    const still = wallTransfer({ ...base, motion: { airSpeed_m_s: 0.02, wallHeight_m: 0.04 } })
    const draught = wallTransfer({ ...base, motion: { airSpeed_m_s: 0.5, wallHeight_m: 0.04 } })
    expect(draught.kWater_m_s).toBeGreaterThan(still.kWater_m_s * 1.5)
  })
})
