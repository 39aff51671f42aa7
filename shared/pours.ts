import type { ProductKind } from './products'
import type { DrinkKind } from './science/glassModel'
import { ML_PER_US_FL_OZ, celsiusToFahrenheit, fahrenheitToCelsius } from './science/standardDrinks'

/**
 * Default tasting-pour volumes by kind, mL, offered when a pour is added and used for the
 * "per pour" figures beside a product. Common practice, no source: tasting rooms pour about
 * 2 fl oz of wine, 1.5 fl oz of fortified wine, 0.75 fl oz of spirit, 4 fl oz of beer or cider; a
 * low- or no-alcohol drink is poured like the wine it stands in for.
 */
export const DEFAULT_TASTING_POUR_ML: Record<ProductKind, number> = {
  still_wine: 60,
  sparkling: 60,
  fortified: 45,
  spirit: 22,
  beer: 120,
  cider: 120,
  low_alcohol: 60,
  other: 60,
}

const DRINK_KIND_OF: Record<ProductKind, DrinkKind> = {
  still_wine: 'still',
  sparkling: 'sparkling',
  fortified: 'fortified',
  spirit: 'spirit',
  beer: 'beer',
  cider: 'cider',
  low_alcohol: 'low_alcohol',
  other: 'other',
}

/** The kind of drink the glass model is told about for a product of this kind (the one mapping). */
export function drinkKindOf(kind: ProductKind): DrinkKind {
  return DRINK_KIND_OF[kind]
}

type VolumeUnit = 'ml' | 'floz'
type TemperatureUnit = 'c' | 'f'

/**
 * The one rule for a volume anyone reads (guest pages, cards, the builder, its inputs): US fl oz to
 * a tenth, mL whole. "2.0" for 60 mL in fl oz, "60" in mL.
 */
export function volumeFigure(ml: number, unit: VolumeUnit): string {
  return unit === 'floz' ? (ml / ML_PER_US_FL_OZ).toFixed(1) : String(Math.round(ml))
}

/** The one rule for a temperature anyone reads: whole degrees. "46" for 8 °C in °F. */
export function temperatureFigure(c: number, unit: TemperatureUnit): string {
  return String(Math.round(unit === 'f' ? celsiusToFahrenheit(c) : c))
}

/** "2.0 fl oz", "60 mL", with no-break spaces: a figure and its unit never part at a line's end. */
export function formatVolume(ml: number, unit: VolumeUnit): string {
  return `${volumeFigure(ml, unit)}\u00a0${unit === 'floz' ? 'fl\u00a0oz' : 'mL'}`
}

/** "46 °F", "8 °C", with a no-break space. */
export function formatTemperature(c: number, unit: TemperatureUnit): string {
  return `${temperatureFigure(c, unit)}\u00a0${unit === 'f' ? '°F' : '°C'}`
}

/** What a typed figure in the venue's unit stands for, in mL and °C. */
export const fromDisplayVolume = (v: number, unit: VolumeUnit) => unit === 'floz' ? v * ML_PER_US_FL_OZ : v
export const fromDisplayTemp = (v: number, unit: TemperatureUnit) => unit === 'f' ? fahrenheitToCelsius(v) : v
