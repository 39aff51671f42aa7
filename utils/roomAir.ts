import { fromDisplayTemp } from '#shared/pours'
import { celsiusToFahrenheit } from '#shared/science/standardDrinks'

/** An air temperature in °C as a form shows it in the venue's unit: to a tenth. */
export function displayAirTemp(c: number, unit: 'c' | 'f'): number {
  return Math.round((unit === 'f' ? celsiusToFahrenheit(c) : c) * 10) / 10
}

/** What a typed air temperature stands for in °C; an empty or unreadable box is NaN, which the schema refuses with its message. */
export function airTempFromDisplay(typed: number | string, unit: 'c' | 'f'): number {
  const n = typeof typed === 'number' ? typed : typed.trim() === '' ? Number.NaN : Number(typed)
  return Number.isFinite(n) ? fromDisplayTemp(n, unit) : Number.NaN
}
