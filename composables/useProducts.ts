import type { MeasurementInput } from '#shared/schemas/products'
import type { ProductView } from '#shared/types/products'
import { formatTemperature, formatVolume, temperatureFigure } from '#shared/pours'

/** The venue's products, with their current numbers and derived figures. */
export function useProductList() {
  return useFetch<ProductView[]>('/api/products', { key: productsKey, default: () => [] })
}

/** One product with its measurement history, newest first. */
export function useProduct(id: number) {
  return useFetch<ProductView>(`/api/products/${id}`, { key: productKey(id) })
}

/**
 * Writes to the catalogue. Each returns the product as the server now derives it and refreshes the
 * list and the product page, so every figure on screen comes from the glass model again.
 */
export function useProductActions() {
  async function refreshAfter(id: number) {
    await refreshNuxtData([productsKey, productKey(id)])
  }
  return {
    async create(body: unknown): Promise<ProductView> {
      const product = await $fetch<ProductView>('/api/products', { method: 'POST', body: body as Record<string, unknown> })
      await refreshNuxtData(productsKey)
      return product
    },
    async save(id: number, patch: Record<string, unknown>): Promise<ProductView> {
      const product = await $fetch<ProductView>(`/api/products/${id}`, { method: 'PATCH', body: patch })
      await refreshAfter(id)
      return product
    },
    async addMeasurement(id: number, body: MeasurementInput): Promise<ProductView> {
      const product = await $fetch<ProductView>(`/api/products/${id}/measurements`, { method: 'POST', body })
      await refreshAfter(id)
      return product
    },
  }
}

/** Numbers as the venue reads them: its volume and temperature units, its currency. */
export function useProductFormat() {
  const { data: venue } = useVenue()
  const { money, dayTime, calendarDay } = useVenueFormat()
  const volumeUnit = computed(() => venue.value?.volumeUnit ?? 'ml')
  const temperatureUnit = computed(() => venue.value?.temperatureUnit ?? 'c')
  return {
    volumeUnit,
    temperatureUnit,
    tempUnitLabel: computed(() => (temperatureUnit.value === 'f' ? '°F' : '°C')),
    currency: computed(() => venue.value?.currency ?? 'USD'),
    money,
    /** An instant in the venue's zone and locale: "Sat, Oct 3, 2:00 PM". */
    dateTime: dayTime,
    /** Serving temperature as a number in the venue's unit, whole degrees. */
    temp: (c: number) => temperatureFigure(c, temperatureUnit.value),
    tempWithUnit: (c: number) => formatTemperature(c, temperatureUnit.value),
    volume: (ml: number) => formatVolume(ml, volumeUnit.value),
    abv: (v: number) => v.toFixed(1),
    sugar: (v: number) => (v < 10 ? v.toFixed(1) : v.toFixed(0)),
    drinks: (v: number) => v.toFixed(2),
    grams: (v: number) => v.toFixed(1),
    index: (v: number) => v.toFixed(1),
    /** A calendar date (YYYY-MM-DD) read as a date, not an instant, so no zone can shift it. */
    day: (iso: string) => calendarDay(iso),
  }
}
