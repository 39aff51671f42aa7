/**
 * What the guest will see: climbing film, clear band, tears — order-of-magnitude predictions from
 * published scaling laws for Marangoni-driven climbing films, plus a plain-English description.
 *
 * Geometry: s is distance along the glass wall, upward; the wall makes angle β with the horizontal
 * (90° = vertical); gravity along the wall is g sin β. The wall is taken as fully wetted (glass
 * pre-wetted by the swirl, zero contact angle).
 */
import { GRAVITY_M_S2 } from './constants'
import { FILM_MASS_LOSS_FRACTION } from './film'
import { WALL_ANGLE_RANGE_DEG, assertInRange } from './ranges'

/**
 * Default wall angle, degrees from horizontal: the bowl of a typical tulip-shaped wine glass leans
 * inward by ~20° from vertical at the liquid line (common practice, no source).
 */
export const DEFAULT_WALL_ANGLE_DEG = 70

/**
 * Thickness of a falling tear relative to the film's zero-flux thickness h*, dimensionless. A ridge
 * falls only once it is thicker than h* (below h* the Marangoni flux is upward); it grows by
 * collecting the climbing film, and we take twice h* as typical of a tear on its way down
 * (estimate, no source; the undercompressive-shock solutions of Dukler et al., Phys. Rev. Fluids 5,
 * 034002, 2020, show ridges of this order of the film thickness — from memory).
 */
const TEAR_THICKNESS_RATIO = 2

/**
 * A climbing film shorter than this many capillary lengths stays hidden in the meniscus region and
 * shows no distinct clear band or tears (estimate: a ridge about ℓc wide cannot separate from a
 * meniscus closer than its own width; no source).
 */
const VISIBLE_BAND_MIN_CAPILLARY_LENGTHS = 1

/** Inputs to the scaling laws, each in the unit its name says. */
export interface TearPhysicsInput {
  /** Marangoni driving force σ(film) − σ(bulk), mN/m. */
  deltaSigma_mN_m: number
  /** Surface tension of the bulk liquid, mN/m. */
  surfaceTension_mN_m: number
  /** Density of the drink, kg/m³. */
  density_kg_m3: number
  /** Viscosity of the drink, mPa·s. */
  viscosity_mPa_s: number
  /** Total evaporation mass flux from the film, kg/(m²·s). */
  evaporationFlux_kg_m2_s: number
  /** Wall angle from horizontal, degrees (15–90). */
  wallAngleDeg?: number
  /** Evaporated fraction of the film at the top of the band (default FILM_MASS_LOSS_FRACTION). */
  massLossFraction?: number
}

/** Predicted appearance of the film and tears. Null where the effect is absent. */
export interface TearPrediction {
  /** Whether a distinct clear band and tears are expected. */
  tearsExpected: boolean
  /** Capillary length √(σ/(ρg)), mm: sets the meniscus and the tears' width. */
  capillaryLength_mm: number
  /** Meniscus rise on the wall, vertical, mm. */
  meniscusHeight_mm: number
  /** Length of the climbing (clear) band along the wall above the meniscus, mm (0 if no film). */
  clearBandHeight_mm: number
  /** Marangoni shear stress Δσ / H, Pa. */
  marangoniStress_Pa: number
  /** Zero-net-flux film thickness h* = 3τ/(2ρ g sinβ), µm. */
  filmThickness_um: number
  /** Thickness of the climbing film at maximum upward flux, τ/(ρ g sinβ), µm. */
  climbingFilmThickness_um: number
  /** Mean climbing speed of the film, mm/s. */
  climbSpeed_mm_s: number
  /** Time after a swirl before tears form, s (null if none expected). */
  tearOnset_s: number | null
  /** Speed at which tears slide back down, mm/s (null if none expected). */
  tearFallSpeed_mm_s: number | null
  /** Typical tear width, ≈ capillary length, mm (null if none expected). */
  tearWidth_mm: number | null
}

/**
 * Scaling-law predictions for the climbing film and tears.
 *
 * Thin-film lubrication on a wall with surface stress τ (Fournier & Cazabat, Europhys. Lett. 20,
 * 517, 1992; Hosoi & Bush, J. Fluid Mech. 442, 217, 2001): flux q(h) = τh²/(2μ) − ρ g sinβ h³/(3μ);
 * zero net flux at h* = 3τ/(2ρ g sinβ); largest upward flux at h_c = τ/(ρ g sinβ) with mean speed
 * ū = τ²/(6 μ ρ g sinβ). Closure (this model): τ = Δσ/H over the band height H, and a parcel's
 * climb time H/ū equals the time f ρ h_c / J to evaporate the fraction f that produced Δσ, so
 *   H⁴ = f Δσ³ / (6 μ ρ g² sin²β J).
 * Tear onset after a swirl: drainage of the swirled film to h* over H (Jeffreys, Proc. Camb. Phil.
 * Soc. 26, 204, 1930 — from memory: h = √(μ s/(ρ g sinβ t))) plus the evaporation time:
 *   t = μ H/(ρ g sinβ h*²) + f ρ h_c / J.
 * Tear fall: a ridge of thickness h_t = 2h* sliding down under gravity against the Marangoni
 * stress, U = ρ g sinβ h_t²/(3μ) − τ h_t/(2μ) = (2/3) ρ g sinβ h*²/μ. Tear width ~ capillary length.
 * Meniscus on a wetted wall leaning at β over the liquid: rise ℓc √(2(1 − cos β)).
 * Valid as order-of-magnitude estimates (factor ~2–3) for the quasi-steady film; see
 * docs/science.md for what it leaves out.
 */
export function predictTears(input: TearPhysicsInput): TearPrediction {
  const beta = input.wallAngleDeg ?? DEFAULT_WALL_ANGLE_DEG
  assertInRange('wallAngleDeg', beta, WALL_ANGLE_RANGE_DEG.min, WALL_ANGLE_RANGE_DEG.max, '° from horizontal')
  const f = input.massLossFraction ?? FILM_MASS_LOSS_FRACTION
  assertInRange('massLossFraction', f, 1e-6, 0.9, '(mass fraction)')
  assertInRange('surfaceTension_mN_m', input.surfaceTension_mN_m, 1, 100, 'mN/m')
  assertInRange('density_kg_m3', input.density_kg_m3, 500, 2000, 'kg/m³')
  assertInRange('viscosity_mPa_s', input.viscosity_mPa_s, 0.1, 1000, 'mPa·s')
  assertInRange('evaporationFlux_kg_m2_s', input.evaporationFlux_kg_m2_s, 1e-12, 1, 'kg/(m²·s)')
  if (!Number.isFinite(input.deltaSigma_mN_m)) throw new RangeError('deltaSigma_mN_m must be a finite number')

  const sinB = Math.sin((beta * Math.PI) / 180)
  const cosB = Math.cos((beta * Math.PI) / 180)
  const rho = input.density_kg_m3
  const mu = input.viscosity_mPa_s * 1e-3 // Pa·s
  const J = input.evaporationFlux_kg_m2_s
  const g = GRAVITY_M_S2
  const lc = Math.sqrt((input.surfaceTension_mN_m * 1e-3) / (rho * g))
  const meniscus = lc * Math.sqrt(2 * (1 - cosB))
  const base = { capillaryLength_mm: lc * 1e3, meniscusHeight_mm: meniscus * 1e3 }
  const ds = input.deltaSigma_mN_m * 1e-3 // N/m

  if (!(ds > 0)) {
    return {
      ...base, tearsExpected: false, clearBandHeight_mm: 0, marangoniStress_Pa: 0, filmThickness_um: 0,
      climbingFilmThickness_um: 0, climbSpeed_mm_s: 0, tearOnset_s: null, tearFallSpeed_mm_s: null, tearWidth_mm: null,
    }
  }
  const H = ((f * ds ** 3) / (6 * mu * rho * g * g * sinB * sinB * J)) ** 0.25
  const tau = ds / H
  const hStar = (3 * tau) / (2 * rho * g * sinB)
  const hClimb = tau / (rho * g * sinB)
  const climbSpeed = (tau * tau) / (6 * mu * rho * g * sinB)
  const expected = H >= VISIBLE_BAND_MIN_CAPILLARY_LENGTHS * lc
  const tDrain = (mu * H) / (rho * g * sinB * hStar * hStar)
  const tEvap = (f * rho * hClimb) / J
  const hTear = TEAR_THICKNESS_RATIO * hStar
  const fall = (rho * g * sinB * hTear * hTear) / (3 * mu) - (tau * hTear) / (2 * mu)
  return {
    ...base,
    tearsExpected: expected,
    clearBandHeight_mm: H * 1e3,
    marangoniStress_Pa: tau,
    filmThickness_um: hStar * 1e6,
    climbingFilmThickness_um: hClimb * 1e6,
    climbSpeed_mm_s: climbSpeed * 1e3,
    tearOnset_s: expected ? tDrain + tEvap : null,
    tearFallSpeed_mm_s: expected ? fall * 1e3 : null,
    tearWidth_mm: expected ? lc * 1e3 : null,
  }
}

/** The fields of a computeFilm result that describePour reads. */
export interface PourDescriptionInput {
  inputs: { abvPctVol: number, tempC: number, sugarGL: number }
  solventMoleFraction: number
  atOrBeyondAzeotrope: boolean
  azeotropeAbvPctVol: number | null
  surfaceTensionBulk_mN_m: number
  surfaceTensionFilm_mN_m: number
  deltaSigma_mN_m: number
  filmActivityIndex: number
  viscosity_mPa_s: number
  sugarViscosityFactor: number
  predictions: TearPrediction
  tearFallSpeedUnsweetened_mm_s: number | null
}

/** Options for describePour. */
export interface DescribeOptions {
  /** Temperature unit in the text (default 'C'). */
  temperatureUnit?: 'C' | 'F'
}

/**
 * Below this Δσ (mN/m) evaporation changes the film's surface tension too little to matter: the
 * pour is treated like one at the azeotrope in the prose (0.01 mN/m is about 1/500 of a table
 * wine's Δσ in this model).
 */
const NEGLIGIBLE_DELTA_SIGMA_MN_M = 0.01

/** A sugar viscosity factor below this is not worth a sentence (5 % slower flow). */
const SUGAR_SENTENCE_MIN_FACTOR = 1.05

/** Rounds for prose: 2 significant figures, no trailing zeros ("12", "0.85", "1.3"). */
function fmt(value: number): string {
  if (value === 0) return '0'
  const digits = Math.max(0, 1 - Math.floor(Math.log10(Math.abs(value))))
  return String(Number(value.toFixed(Math.min(digits, 3))))
}

function fmtTemp(tempC: number, unit: 'C' | 'F'): string {
  return unit === 'F' ? `${Math.round((tempC * 9) / 5 + 32)} °F` : `${Math.round(tempC)} °C`
}

/** The sentence every description ends with. */
export const QUALITY_DISCLAIMER
  = 'Tears say nothing about quality: they come from alcohol and evaporation, and sugar only slows them — it does not make them.'

/**
 * A few short sentences for a guest, built from a computeFilm result: what to look for (climbing
 * film, clear band, tears and their speed, with this pour's predicted numbers), why (ethanol leaves
 * the thin film faster than water, the film's surface tension rises, and the difference pulls
 * liquid up the glass — the Gibbs–Marangoni effect), why sugar slows the tears (viscosity), and
 * always that tears tell nothing about quality. Handles 0 % vol (no climbing film), the azeotrope
 * and beyond (no tears from this effect) and films too short to show.
 */
export function describePour(result: PourDescriptionInput, options: DescribeOptions = {}): string[] {
  const unit = options.temperatureUnit ?? 'C'
  const { abvPctVol, tempC, sugarGL } = result.inputs
  const p = result.predictions
  const out: string[] = []
  const at = `At ${fmt(abvPctVol)} % ABV and ${fmtTemp(tempC, unit)}`

  if (result.solventMoleFraction === 0) {
    out.push(
      `${at} there is no alcohol to evaporate, so the liquid left on the glass keeps the same surface tension as the rest: expect no climbing film and no tears.`,
      'Any drops that run down after a swirl are simply draining under gravity.',
    )
  }
  else if (result.atOrBeyondAzeotrope || !(result.deltaSigma_mN_m > NEGLIGIBLE_DELTA_SIGMA_MN_M)) {
    const azeo = result.azeotropeAbvPctVol === null ? '' : ` (from about ${fmt(result.azeotropeAbvPctVol)} % ABV up, in this model)`
    out.push(
      `${at} water and ethanol leave the glass in nearly the proportion they are in the liquid${azeo}, so evaporation no longer makes the film on the wall more watery.`,
      'Its surface tension does not rise above the rest of the pour, so there is nothing to pull a film up the glass: no tears from this effect.',
    )
  }
  else if (!p.tearsExpected || p.tearOnset_s === null || p.tearFallSpeed_mm_s === null || p.tearWidth_mm === null) {
    out.push(
      `${at} evaporation still makes the film on the glass slightly more watery, raising its surface tension by only ${fmt(result.deltaSigma_mN_m)} mN/m.`,
      `That pull can lift a film only about ${fmt(p.clearBandHeight_mm)} mm, inside the curve of the liquid's edge, so distinct tears are unlikely.`,
    )
  }
  else {
    out.push(
      `${at}, swirl and watch the glass: within about ${fmt(p.tearOnset_s)} s a clear film about ${fmt(p.filmThickness_um)} µm thick should climb roughly ${fmt(p.clearBandHeight_mm)} mm above the liquid, gather into a ridge, and drop back as tears about ${fmt(p.tearWidth_mm)} mm wide, sliding at around ${fmt(p.tearFallSpeed_mm_s)} mm/s.`,
      `Why: ethanol evaporates from that thin film faster than water, so the film turns more watery and its surface tension rises from ${result.surfaceTensionBulk_mN_m.toFixed(1)} to ${result.surfaceTensionFilm_mN_m.toFixed(1)} mN/m; the stronger pull of the film draws liquid up from below (the Gibbs–Marangoni effect) until the ridge grows too heavy and falls.`,
    )
    const unsweet = result.tearFallSpeedUnsweetened_mm_s
    if (sugarGL > 0 && result.sugarViscosityFactor >= SUGAR_SENTENCE_MIN_FACTOR && unsweet !== null && unsweet > 0) {
      const slower = Math.round(100 * (1 - p.tearFallSpeed_mm_s / unsweet))
      out.push(
        `Its ${fmt(sugarGL)} g/L of sugar makes it ${fmt(result.sugarViscosityFactor)} times as viscous (${fmt(result.viscosity_mPa_s)} mPa·s), so the tears fall about ${slower} % slower than they would without it.`,
      )
    }
  }
  out.push(QUALITY_DISCLAIMER)
  return out
}
