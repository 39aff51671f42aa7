import type { ProductKind } from './products'
import { ML_PER_US_FL_OZ, celsiusToFahrenheit, fahrenheitToCelsius } from './science/standardDrinks'

/**
 * Default tasting-pour volumes by kind, mL, offered when a pour is added and used for the
 * "per pour" figures beside a product. Common practice, no source: tasting rooms pour about
 * 2 fl oz of wine, 1.5 fl oz of fortified wine, 0.75 fl oz of spirit, 4 fl oz of beer or cider.
 */
export const DEFAULT_TASTING_POUR_ML: Record<ProductKind, number> = {
  still_wine: 60,
  sparkling: 60,
  fortified: 45,
  spirit: 22,
  beer: 120,
  cider: 120,
  other: 60,
}

export function formatVolume(ml: number, unit: 'ml' | 'floz'): string {
  return unit === 'floz' ? `${(ml / ML_PER_US_FL_OZ).toFixed(1)} fl oz` : `${Math.round(ml)} mL`
}

export function formatTemperature(c: number, unit: 'c' | 'f'): string {
  return unit === 'f' ? `${Math.round(celsiusToFahrenheit(c))} °F` : `${Math.round(c)} °C`
}

export const toDisplayVolume = (ml: number, unit: 'ml' | 'floz') => unit === 'floz' ? Math.round(ml / ML_PER_US_FL_OZ * 100) / 100 : Math.round(ml)
export const fromDisplayVolume = (v: number, unit: 'ml' | 'floz') => unit === 'floz' ? v * ML_PER_US_FL_OZ : v
export const toDisplayTemp = (c: number, unit: 'c' | 'f') => unit === 'f' ? Math.round(celsiusToFahrenheit(c) * 10) / 10 : c
export const fromDisplayTemp = (v: number, unit: 'c' | 'f') => unit === 'f' ? fahrenheitToCelsius(v) : v
