/**
 * The climbing film on the wall above a pour, second edition: evaporation into the room's air
 * (each vapour with its own transfer coefficient, water free to condense), the film's energy
 * balance (evaporative cooling, a thermal Marangoni term), and the lubrication closure that turns
 * the rate at which the film's surface tension rises into a stress, a film thickness, a flux up
 * the wall and what a guest sees.
 *
 * Geometry: s is distance along the wall, upward from the liquid line; the wall makes angle β with
 * the horizontal (90° = vertical); gravity along the wall is g sin β. The wall is taken as fully
 * wetted (the swirl pre-wets it, zero contact angle) and the room's air as quiet (draughts below
 * ~0.2 m/s). Every quantity carries its unit in its name.
 */
import { type AirMotion, wallTransfer } from './air'
import { GAS_CONSTANT_J_MOL_K, GRAVITY_M_S2, KELVIN_AT_0C, MOLAR_MASS_ETHANOL_G_MOL, MOLAR_MASS_WATER_G_MOL, STANDARD_ATMOSPHERE_PA } from './constants'
import { mixtureSigmaUnchecked } from './surfaceTension'
import {
  type GlassSetFactors, saturationPressureLogSlope_1_K, vaporisationEnthalpy_J_mol, vapourStateUnchecked,
} from './vle'

/**
 * Fraction of the film's water + ethanol exchanged with the air (evaporated or condensed, counted
 * gross) by the time a parcel reaches the top of the clear band, where the ridge forms. This is the
 * model's one calibrated number: it sets the band height and the time to the first tears, and
 * nothing else (the stress, the film thickness, the flux up the wall, the index and the tear speed
 * do not depend on it in the small-exchange limit — see filmClimb). 0.03 puts the band of a 12 % vol still wine at 20 °C in a
 * 50 % RH room near 1 cm, the height commonly seen in a tasting glass (common practice, no source;
 * no published band-height measurement for a stated mixture, glass and room was at hand —
 * docs/science.md, "Left out"). The ranges carry it at ×/÷ 2.
 */
export const FILM_EXCHANGE_FRACTION = 0.03

/**
 * Ridge thickness relative to the zero-flux thickness h*: a ridge falls only once thicker than h*
 * (below it the Marangoni flux is upward); 2h* is taken as typical of a tear on its way down
 * (estimate; the undercompressive-shock profiles of Dukler, Ji, Falcon & Bertozzi, Phys. Rev.
 * Fluids 5, 034002, 2020, show ridges of a few film thicknesses — from memory).
 */
const TEAR_THICKNESS_RATIO = 2

/**
 * Most unstable wavenumber of a driven contact line, in units of its capillary length
 * ℓ = h (3 Ca)^(−1/3): q ≈ 0.45, so the spacing of fingers (here: tears) is λ = 2π ℓ / 0.45 ≈ 14 ℓ.
 * Troian, Herbolzheimer, Safran & Joanny, Europhys. Lett. 10, 25 (1989), for gravity-driven films;
 * the same fingering for Marangoni-driven films: Cazabat, Heslot, Troian & Carles, Nature 346, 824
 * (1990) (both from memory).
 */
const FINGERING_WAVENUMBER = 0.45

/**
 * A climbing film shorter than this many capillary lengths stays inside the meniscus and shows no
 * distinct steady band (a ridge ~ℓc wide cannot separate from a meniscus closer than its own
 * width; estimate, no source).
 */
const VISIBLE_BAND_MIN_CAPILLARY_LENGTHS = 1

/**
 * The thermal rise is capped at the solutal one, so cooling supplies at most half of the pull.
 * Without the cap a trace of ethanol would switch on the whole thermal Marangoni stress of an
 * evaporating water film, and pure water would be predicted to climb; it does not visibly do so
 * on a glass (its film drains and breaks up; common practice, no source). A modelling choice,
 * documented in docs/science.md; it binds only below ~1 % vol and above ~60 % vol.
 */
const THERMAL_SHARE_MAX = 0.5

/**
 * Glass wall: thermal conductivity of soda-lime glass ≈ 1.0 W/(m·K) (handbook range 0.9–1.05 —
 * from memory) times a wall 1.2 mm thick (tasting glasses 0.8–2 mm, common practice, no source).
 * The wall conducts heat from the liquid up into the cooled film (a fin).
 */
const GLASS_WALL_CONDUCTANCE_W_K = 1.0 * 1.2e-3

/** Everything the film physics needs, in SI-flavoured units named in each field. */
export interface FilmPhysicsInput {
  /** Ethanol mole fraction of the water–ethanol solvent, 0–1. */
  x1: number
  /** Liquid temperature, °C. */
  liquidTempC: number
  /** Sugar mass fraction of the drink, 0–0.5. */
  sugarMassFraction: number
  /** Density of the drink, kg/m³. */
  density_kg_m3: number
  /** Viscosity of the drink, mPa·s. */
  viscosity_mPa_s: number
  /** Room: relative humidity %, air temperature °C. */
  relativeHumidityPct: number
  airTempC: number
  /** Wall angle from horizontal, degrees. */
  wallAngleDeg: number
  /** Inside diameter of the bowl at the liquid line, mm (sets how many tears fit around). */
  bowlDiameterMm: number
  motion: AirMotion
  /** Fraction exchanged by the band's top (FILM_EXCHANGE_FRACTION unless a range is being sampled or a calibration applies). */
  exchangeFraction: number
  /** Multiplier of the air's transfer coefficients k_E, k_W and h (1 = published; the calibration's massTransferFactor; air.ts wallTransfer). */
  massTransferFactor?: number
  /** Multipliers for the uncertainty ranges (1 = nominal). */
  factors?: FilmFactors
}

/** Multipliers applied to uncertain parameters when ranges are sampled; all default to 1. */
export interface FilmFactors extends GlassSetFactors {
  sigmaSlope?: number
  glassConductance?: number
}

/** The film's evaporation and energy balance. */
export interface FilmExchange {
  /** Ethanol mass flux out of the film, kg/(m²·s) (≥ 0). */
  ethanolFlux_kg_m2_s: number
  /** Water mass flux out of the film, kg/(m²·s): negative when the film takes water up from the room. */
  waterFlux_kg_m2_s: number
  /** Ethanol and water partial pressures at the film surface, Pa. */
  pEthanol_Pa: number
  pWater_Pa: number
  /** Water vapour partial pressure of the room air, Pa. */
  roomWaterPressure_Pa: number
  /** Relative volatility γ1P1sat/(γ2P2sat) at the film's temperature. */
  relativeVolatility: number
  /** Transfer coefficients, m/s and W/(m²·K). */
  kEthanol_m_s: number
  kWater_m_s: number
  hAir_W_m2_K: number
  /** Heat taken by evaporation (negative if condensation gives heat), W/m². */
  evaporativeHeat_W_m2: number
  /** How much cooler than the liquid the film is at the top of the band, K (negative = warmer). */
  filmCooling_K: number
  /** Mean cooling over the band, K. */
  meanFilmCooling_K: number
}

/** The lubrication closure's results. */
export interface FilmClimb {
  exchange: FilmExchange
  /** Rate of surface-tension rise of the film per unit film mass, Ṡ in dσ/dt = Ṡ/(ρh), N·kg/(m³·s) (≥ 0). */
  solutalDrive: number
  /** ∂σ/∂x1 of the bulk, mN/m per unit mole fraction (negative). */
  sigmaSlope_mN_m: number
  /** Surface-tension rise over the band from composition, mN/m. */
  solutalDeltaSigma_mN_m: number
  /** Surface-tension rise over the band from cooling, mN/m (negative if the film is warmer). */
  thermalDeltaSigma_mN_m: number
  /** Marangoni shear stress on the film, τ, Pa. */
  marangoniStress_Pa: number
  /** Climbing film thickness h_c = τ/(ρ g sinβ), µm. */
  climbingFilmThickness_um: number
  /** Zero-net-flux thickness h* = 3τ/(2ρ g sinβ), µm: thicker liquid falls. */
  filmThickness_um: number
  /** Mean climbing speed ū = τ²/(6 μ ρ g sinβ), mm/s. */
  climbSpeed_mm_s: number
  /** Volume flux up the wall per unit length of the liquid line, q = τ³/(6 μ (ρ g sinβ)²), mm²/s. */
  climbFlux_mm2_s: number
  /** Clear band from the meniscus to the ridge, mm. */
  clearBandHeight_mm: number
  /** Capillary length √(σ/(ρg)), mm, and the meniscus rise on the wall, mm. */
  capillaryLength_mm: number
  meniscusHeight_mm: number
  /** Whether the steady band rises clear of the meniscus (band ≥ one capillary length). */
  bandVisible: boolean
  /** Time after a swirl to the first tears, s (null when no film climbs; likewise below). */
  tearOnset_s: number | null
  /** Speed of a falling tear, mm/s. */
  tearFallSpeed_mm_s: number | null
  /** Width of a tear ≈ capillary length, mm. */
  tearWidth_mm: number | null
  /** Spacing of tears along the ridge (fingering wavelength), mm. */
  tearSpacing_mm: number | null
  /** How many tears stand around the glass at once, π·D/λ. */
  tearsAround: number | null
  /** How long the curtain left by a swirl keeps draining into tears, s (then the steady band alone). */
  swirlShow_s: number | null
}

const sinDeg = (deg: number): number => Math.sin((deg * Math.PI) / 180)

/** Vapour pressures at the film surface at temperature T_K (glass-temperature activity set). */
function surfaceVapour(x1: number, T_K: number, factors?: GlassSetFactors) {
  return vapourStateUnchecked(x1, T_K, 'glass', factors)
}

/**
 * Evaporation and energy balance of the film at bulk composition x1, given the film's mean cooling
 * below the liquid (K) and the band height (m, for the fin). Fluxes J_i = k_i (c_i,surface − c_i,room),
 * c = p/(RT), room ethanol 0, room water RH·P2sat(T_air); Stefan flow neglected (vapour mole
 * fractions < 8 %). Energy: the film loses L_i J_i to evaporation and gains h_air (T_air − T_f)
 * on both faces of the wall, and heat conducted up the glass from the liquid (a fin of conductance
 * GLASS_WALL_CONDUCTANCE_W_K, tip insulated at the top of the wetted wall): with θ = T_liquid − T_f,
 * θ(s) = θ∞ (1 − cosh(m(L − s))/cosh(mL)), θ∞ = Q0/m_h, m = √(m_h / conductance), linearised in θ.
 * Evaporative cooling of tears of wine: Venerus & Nieto Simavilla, Sci. Rep. 5, 16162 (2015).
 */
function filmExchange(input: FilmPhysicsInput, bandHeight_m: number, meanCooling_K: number): FilmExchange {
  const f = input.factors ?? {}
  const TL = input.liquidTempC + KELVIN_AT_0C
  const Ts = TL - meanCooling_K
  const Ta = input.airTempC + KELVIN_AT_0C
  const v = surfaceVapour(input.x1, Ts, f)
  const P2sAir = 10 ** (10.11564 - 1687.537 / (Ta - 42.98)) // water Antoine, Poling et al. (as in vle.ts)
  const pRoom = (Math.min(100, Math.max(0, input.relativeHumidityPct)) / 100) * P2sAir
  const t = wallTransfer({
    surfaceT_K: Ts, airT_K: Ta,
    surfaceYEthanol: v.pEthanol_Pa / STANDARD_ATMOSPHERE_PA, surfaceYWater: v.pWater_Pa / STANDARD_ATMOSPHERE_PA,
    roomYWater: pRoom / STANDARD_ATMOSPHERE_PA, motion: input.motion, transferFactor: input.massTransferFactor,
  })
  const R = GAS_CONSTANT_J_MOL_K
  const nE = (t.kEthanol_m_s * v.pEthanol_Pa) / (R * Ts) // mol/(m²·s)
  const nW = t.kWater_m_s * (v.pWater_Pa / (R * Ts) - pRoom / (R * Ta))
  const LE = vaporisationEnthalpy_J_mol('ethanol', Ts)
  const LW = vaporisationEnthalpy_J_mol('water', Ts)
  const heat = nE * LE + nW * LW
  // Linearised response of the evaporative heat to the film's temperature, W/(m²·K).
  const dHeat = nE * LE * (saturationPressureLogSlope_1_K('ethanol', Ts) - 1 / Ts)
    + ((t.kWater_m_s * v.pWater_Pa) / (R * Ts)) * LW * (saturationPressureLogSlope_1_K('water', Ts) - 1 / Ts)
  const hBoth = 2 * t.hAir_W_m2_K
  // Q0: net heat the film loses at θ = 0 (film at the liquid's temperature).
  const q0 = heat + dHeat * meanCooling_K - hBoth * (Ta - TL)
  const mh = Math.max(1e-6, dHeat + hBoth)
  const m = Math.sqrt(mh / (GLASS_WALL_CONDUCTANCE_W_K * (f.glassConductance ?? 1)))
  const L = input.motion.wallHeight_m
  const thetaInf = q0 / mh
  const H = Math.min(Math.max(bandHeight_m, 0), L)
  const shape = (s: number): number => 1 - Math.cosh(m * (L - s)) / Math.cosh(m * L)
  // Mean of the fin profile over the band [0, H]: 1 − (sinh(mL) − sinh(m(L−H))) / (m H cosh(mL)).
  const meanShape = H > 0 ? 1 - (Math.sinh(m * L) - Math.sinh(m * (L - H))) / (m * H * Math.cosh(m * L)) : 0
  return {
    ethanolFlux_kg_m2_s: nE * MOLAR_MASS_ETHANOL_G_MOL * 1e-3,
    waterFlux_kg_m2_s: nW * MOLAR_MASS_WATER_G_MOL * 1e-3,
    pEthanol_Pa: v.pEthanol_Pa,
    pWater_Pa: v.pWater_Pa,
    roomWaterPressure_Pa: pRoom,
    relativeVolatility: v.relativeVolatility,
    kEthanol_m_s: t.kEthanol_m_s,
    kWater_m_s: t.kWater_m_s,
    hAir_W_m2_K: t.hAir_W_m2_K,
    evaporativeHeat_W_m2: heat,
    filmCooling_K: thetaInf * shape(H),
    meanFilmCooling_K: thetaInf * meanShape,
  }
}

/**
 * The climbing film by lubrication theory (Fournier & Cazabat, Europhys. Lett. 20, 517, 1992;
 * Hosoi & Bush, J. Fluid Mech. 442, 217, 2001): on a wall at β with surface stress τ, the volume
 * flux per unit width of a film of thickness h is q(h) = τh²/(2μ) − ρ g sinβ h³/(3μ). It is largest
 * at h_c = τ/(ρ g sinβ), q = τ³/(6 μ (ρ g sinβ)²), mean speed ū = τ²/(6 μ ρ g sinβ), and zero at
 * h* = 3h_c/2; thicker liquid falls.
 *
 * Closure. Evaporation raises the film's surface tension at dσ/dt = Ṡ/(ρh), with
 * Ṡ = −(∂σ/∂x1) (x2 N_E − x1 N_W) M̄ / (1 − w_sugar) from the molar fluxes N (a film of n = ρh(1 − w)/M̄
 * moles per area changes composition at dx1/dt = −(x2 N_E − x1 N_W)/n). A parcel climbing at ū in
 * a film h_c gains Δσ = Ṡ t/(ρ h_c) over t = H/ū; the stress is that rise over the band, τ = Δσ/H.
 * Together: τ⁴ = 6 μ ρ g² sin²β Ṡ — in the small-exchange limit the stress, thickness, speed and
 * flux follow from Ṡ alone, whatever the band height. The band's top is where the film has
 * exchanged (evaporated or condensed, gross) the fraction f of its water + ethanol
 * (FILM_EXCHANGE_FRACTION): its composition there, x1,top = x1 − n_f (x2 N_E − x1 N_W)/N_gross,
 * gives the solutal rise Δσ_S = σ(x1,top) − σ(x1) (a secant, so a very dilute film cannot become
 * more watery than water); with J_gross = |J_E| + |J_W|, a parcel reaching the top has spent
 * t = f(1 − w)ρh_c/J_gross, so τ⁴ = 6 μ ρ g² sin²β J_gross Δσ / (f (1 − w)) and H = Δσ/τ. The cooled
 * film adds a thermal rise Δσ_T = σ(T_f) − σ(T_liquid) at the band's top, Δσ = Δσ_S + Δσ_T, solved by
 * fixed-point iteration together with the energy balance (filmExchange).
 *
 * After a swirl (Dukler, Ji, Falcon & Bertozzi, Phys. Rev. Fluids 5, 034002, 2020: the swirled,
 * pre-wetted wall drains as a thick film that meets the climbing film in a shock, from which tears
 * fall): the swirled film thins by gravity as h = √(μ s/(ρ g sinβ t)) (Jeffreys, Proc. Camb. Phil.
 * Soc. 26, 204, 1930 — from memory); the first tears come once it has drained to h* over the band
 * and a parcel has climbed it, t = μH/(ρ g sinβ h*²) + H/ū; tears keep raining from the swirled
 * wall of height L until the slowest kinematic wave of the draining film, c = dq/dh at h* =
 * ρ g sinβ h*²/(3μ), has crossed it: t_show = 3μL/(ρ g sinβ h*²); afterwards only the steady band feeds tears. A tear, a ridge
 * 2h* thick sliding under gravity against τ, falls at U = (2/3) ρ g sinβ h*²/μ; tears stand
 * λ = 2π h_c (3Ca)^(−1/3)/0.45 apart (Ca = μū/σ), so about πD/λ fit around a bowl of diameter D.
 * The meniscus on a wetted wall leaning at β rises ℓc √(2(1 − cos β)).
 *
 * Limits: quasi-steady film, clean glass and surface (no surfactants), still air, one composition
 * per parcel (no diffusion along the film); the numbers hold to a factor of about 2, which the
 * ranges of glassModel carry.
 */
export function filmClimb(input: FilmPhysicsInput): FilmClimb {
  const f = input.factors ?? {}
  const beta = input.wallAngleDeg
  const sinB = sinDeg(beta)
  const cosB = Math.cos((beta * Math.PI) / 180)
  const rho = input.density_kg_m3
  const mu = input.viscosity_mPa_s * 1e-3
  const g = GRAVITY_M_S2
  const x1 = input.x1
  const x2 = 1 - x1
  const TL = input.liquidTempC
  const sigma = mixtureSigmaUnchecked(x1, TL) // mN/m
  const dx = 1e-5
  const slope = ((mixtureSigmaUnchecked(Math.min(1, x1 + dx), TL) - mixtureSigmaUnchecked(Math.max(0, x1 - dx), TL))
    / (Math.min(1, x1 + dx) - Math.max(0, x1 - dx))) * (f.sigmaSlope ?? 1)
  const lc = Math.sqrt((sigma * 1e-3) / (rho * g))
  const meniscus = lc * Math.sqrt(2 * (1 - cosB))
  const Mbar = (x1 * MOLAR_MASS_ETHANOL_G_MOL + x2 * MOLAR_MASS_WATER_G_MOL) * 1e-3 // kg/mol
  const solventShare = 1 - input.sugarMassFraction
  const grav = rho * g * sinB

  let H = 0.01
  let cooling = 0
  let ex = filmExchange(input, H, cooling)
  let S = 0
  let tau = 0
  let solutal = 0
  let thermal = 0
  for (let i = 0; i < 60; i++) {
    ex = filmExchange(input, H, cooling)
    const nE = ex.ethanolFlux_kg_m2_s / (MOLAR_MASS_ETHANOL_G_MOL * 1e-3)
    const nW = ex.waterFlux_kg_m2_s / (MOLAR_MASS_WATER_G_MOL * 1e-3)
    const jGross = Math.abs(ex.ethanolFlux_kg_m2_s) + Math.abs(ex.waterFlux_kg_m2_s)
    const nGross = Math.abs(nE) + Math.abs(nW)
    const drift = x2 * nE - x1 * nW // mol/(m²·s): how fast evaporation takes ethanol from the film, net
    S = Math.max(0, -(slope * 1e-3) * drift * Mbar / solventShare)
    if (!(jGross > 0) || !(nGross > 0) || !(drift > 0)) {
      tau = 0
      H = 0
      break
    }
    // Composition at the band's top: the film has exchanged the fraction f (in moles: f M̄/M̄_exchanged).
    const molesExchanged = (input.exchangeFraction * solventShare * Mbar * nGross) / jGross
    const x1Top = Math.min(1, Math.max(0, x1 - (molesExchanged * drift) / nGross))
    solutal = (mixtureSigmaUnchecked(x1Top, TL) - sigma) * 1e-3 * (f.sigmaSlope ?? 1) // N/m
    thermal = (mixtureSigmaUnchecked(x1, TL - ex.filmCooling_K) - sigma) * 1e-3 // N/m
    // The cooling can at most match the solutal rise (THERMAL_SHARE_MAX): it acts on a film that
    // composition draws up, and pure water, which cools too, shows no climbing film.
    thermal = Math.min(thermal, (solutal * THERMAL_SHARE_MAX) / (1 - THERMAL_SHARE_MAX))
    const rise = Math.max(0, solutal + thermal)
    const next = (6 * mu * rho * g * g * sinB * sinB * jGross * rise / (input.exchangeFraction * solventShare)) ** 0.25
    const nextH = next > 0 ? Math.min(input.motion.wallHeight_m, rise / next) : 0
    const done = i > 0 && Math.abs(next - tau) <= 1e-6 * next && Math.abs(nextH - H) <= 1e-6 * Math.max(nextH, 1e-6)
    tau = i < 2 ? next : 0.5 * (tau + next) + 0.3 * (next - tau)
    H = i < 2 ? nextH : 0.5 * (H + nextH) + 0.3 * (nextH - H)
    cooling = ex.meanFilmCooling_K
    if (done || !(tau > 0)) break
  }
  const base = {
    exchange: ex,
    solutalDrive: S,
    sigmaSlope_mN_m: slope,
    capillaryLength_mm: lc * 1e3,
    meniscusHeight_mm: meniscus * 1e3,
  }
  if (!(tau > 0) || !(H > 0)) {
    return {
      ...base, solutalDeltaSigma_mN_m: 0, thermalDeltaSigma_mN_m: 0, marangoniStress_Pa: 0,
      climbingFilmThickness_um: 0, filmThickness_um: 0, climbSpeed_mm_s: 0, climbFlux_mm2_s: 0, clearBandHeight_mm: 0,
      bandVisible: false, tearOnset_s: null, tearFallSpeed_mm_s: null, tearWidth_mm: null, tearSpacing_mm: null, tearsAround: null, swirlShow_s: null,
    }
  }
  const hc = tau / grav
  const hStar = 1.5 * hc
  const u = (tau * tau) / (6 * mu * grav)
  const q = tau ** 3 / (6 * mu * grav * grav)
  const visible = H >= VISIBLE_BAND_MIN_CAPILLARY_LENGTHS * lc
  const hTear = TEAR_THICKNESS_RATIO * hStar
  const fall = (grav * hTear * hTear) / (3 * mu) - (tau * hTear) / (2 * mu)
  const ca = (mu * u) / (sigma * 1e-3)
  const spacing = ((2 * Math.PI) / FINGERING_WAVENUMBER) * hc * (3 * ca) ** (-1 / 3)
  const circumference = Math.PI * input.bowlDiameterMm * 1e-3
  return {
    ...base,
    solutalDeltaSigma_mN_m: solutal * 1e3,
    thermalDeltaSigma_mN_m: thermal * 1e3,
    marangoniStress_Pa: tau,
    climbingFilmThickness_um: hc * 1e6,
    filmThickness_um: hStar * 1e6,
    climbSpeed_mm_s: u * 1e3,
    climbFlux_mm2_s: q * 1e6,
    clearBandHeight_mm: H * 1e3,
    bandVisible: visible,
    tearOnset_s: (mu * H) / (grav * hStar * hStar) + H / u,
    tearFallSpeed_mm_s: fall * 1e3,
    tearWidth_mm: lc * 1e3,
    tearSpacing_mm: spacing * 1e3,
    tearsAround: circumference / spacing,
    swirlShow_s: (3 * mu * input.motion.wallHeight_m) / (grav * hStar * hStar),
  }
}
