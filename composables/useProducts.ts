import type { MeasurementInput, ProductSort } from '#shared/schemas/products'
import type { ProductListItem, ProductPage, ProductView } from '#shared/types/products'
import type { ComboOption } from '~/utils/comboOptions'
import { formatTemperature, formatVolume, temperatureFigure } from '#shared/pours'

/** How many products a search field offers at once: the best matches, never the catalogue. */
const PRODUCT_SEARCH_COUNT = 8

/** A product as one choice of a search field: its name, then producer, vintage, ABV and code. */
function productOption(p: ProductListItem): ComboOption {
  const detail = [p.producer, p.vintageOrBatch, `${p.current.abvPctVol} % ABV`, p.code].filter(Boolean).join(' · ')
  return { value: String(p.id), label: p.name, detail, search: '' }
}

/**
 * A FormCombobox `search` over the catalogue on the server (the builder's pickers, the observations
 * filter): the first matches by name, each product handed to `remember` so the caller can name it.
 */
export function productSearch(opts: { status: 'active' | 'all', remember?: (p: ProductListItem) => void }) {
  return async (text: string): Promise<ComboOption[]> => {
    const page = await $fetch<ProductPage>('/api/products', { query: { q: text || undefined, status: opts.status, pageSize: PRODUCT_SEARCH_COUNT } })
    for (const p of page.items) opts.remember?.(p)
    return page.items.map(productOption)
  }
}

export type ProductShow = 'active' | 'retired' | 'all'
export interface ProductListState { search: string, show: ProductShow, sort: ProductSort, desc: boolean, page: number }

/**
 * The products list as the manager pages through it: search words (sent a moment after the last
 * key), which statuses, the sort and the page, all answered by the server a page at a time.
 */
export async function useProductList(pageSize = 20) {
  const state = reactive<ProductListState>({ search: '', show: 'active', sort: 'name', desc: false, page: 1 })
  const q = ref('')
  let timer: ReturnType<typeof setTimeout> | undefined
  watch(() => state.search, (text) => {
    clearTimeout(timer)
    timer = setTimeout(() => (q.value = text.trim()), 300)
  })
  if (import.meta.client) onBeforeUnmount(() => clearTimeout(timer))
  watch([q, () => state.show, () => state.sort, () => state.desc], () => (state.page = 1))
  const query = computed(() => ({ q: q.value || undefined, status: state.show, sort: state.sort, dir: state.desc ? 'desc' : 'asc', page: state.page, pageSize }))
  const fetched = await useFetch<ProductPage>('/api/products', { key: productsKey, query, default: () => ({ items: [], page: 1, pageSize, total: 0, counts: { active: 0, retired: 0 } }) })
  return { state, ...fetched }
}

/** One product with its measurement history, newest first. */
export function useProduct(id: number) {
  return useFetch<ProductView>(`/api/products/${id}`, { key: productKey(id) })
}

/**
 * Writes to the catalogue. Each returns the product as the server now derives it; that answer
 * becomes the product page's data at once (no second read, which could fail after the write had
 * succeeded and empty the page), and the products list's kept copy is dropped, so the list is read
 * afresh the next time it is shown (it is paged and sorted on the server: no copy here can be
 * patched in place).
 */
export function useProductActions() {
  const nuxtApp = useNuxtApp()
  const settle = (product: ProductView) => nuxtApp.runWithContext(() => {
    useNuxtData<ProductView>(productKey(product.id)).data.value = product
    clearNuxtData(productsKey)
  })
  return {
    async create(body: unknown): Promise<ProductView> {
      const product = await $fetch<ProductView>('/api/products', { method: 'POST', body: body as Record<string, unknown> })
      settle(product)
      return product
    },
    async save(id: number, patch: Record<string, unknown>): Promise<ProductView> {
      const product = await $fetch<ProductView>(`/api/products/${id}`, { method: 'PATCH', body: patch })
      settle(product)
      return product
    },
    async addMeasurement(id: number, body: MeasurementInput): Promise<ProductView> {
      const product = await $fetch<ProductView>(`/api/products/${id}/measurements`, { method: 'POST', body })
      settle(product)
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
