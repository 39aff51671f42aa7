import { defineStore } from 'pinia'
import type { FieldErrors } from '#shared/utils/fieldErrors'
import { DEFAULT_TASTING_POUR_ML } from '#shared/pours'
import type { ProductKind } from '#shared/products'
import type { FlightStatus } from '#shared/flights'
import { POURS_MAX } from '#shared/flights'
import type { FlightPreview, FlightView, GlassView } from '#shared/types/flights'
import type { ProductListItem, ProductPage } from '#shared/types/products'

export interface BuilderPour { key: number, productId: number, volumeMl: number, glassId: number, servingTempC: number, note: string | null }

/** Which glass a new pour of each kind goes into by default, by the glass's name. */
const GLASS_FOR_KIND: Record<ProductKind, RegExp> = {
  sparkling: /flute/i, spirit: /nosing/i, fortified: /nosing/i, beer: /tumbler/i, cider: /tumbler/i, still_wine: /tulip|wine/i, low_alcohol: /tulip|wine/i, other: /tulip|wine/i,
}

let nextKey = 1

/**
 * The flight being built: its pours as the manager edits them, the server's live figures for
 * them (debounced preview), and the actions that save, publish, retire or make a new version.
 */
export const useFlightBuilderStore = defineStore('flightBuilder', () => {
  const id = ref<number | null>(null)
  const name = ref('')
  const summary = ref('')
  const status = ref<FlightStatus>('draft')
  const version = ref(1)
  const locked = ref(false)
  const sessionCount = ref(0)
  const pours = ref<BuilderPour[]>([])
  const preview = ref<FlightPreview | null>(null)
  const previewError = ref('')
  const errors = ref<FieldErrors>({})
  const message = ref('')
  const error = ref('')
  const busy = ref(false)
  const dirty = ref(false)
  /** The products the builder knows: the flight's own, and each one found and chosen since. */
  const products = ref<ProductListItem[]>([])
  const glasses = ref<GlassView[]>([])

  const canEditPours = computed(() => status.value === 'draft' || (status.value === 'published' && !locked.value))
  const canAddPour = computed(() => canEditPours.value && pours.value.length < POURS_MAX)

  function fromView(view: FlightView) {
    id.value = view.id
    name.value = view.name
    summary.value = view.summary
    status.value = view.status
    version.value = view.version
    locked.value = view.locked
    sessionCount.value = view.sessionCount
    pours.value = view.pours.map(p => ({ key: nextKey++, productId: p.productId, volumeMl: p.volumeMl, glassId: p.glass.id, servingTempC: p.servingTempC, note: p.note }))
    preview.value = { pours: view.pours, totals: view.totals }
    dirty.value = false
  }

  /** Keeps a product found by a search, so its pour row can name it (the newest copy wins). */
  function remember(product: ProductListItem) {
    const at = products.value.findIndex(p => p.id === product.id)
    if (at >= 0) products.value.splice(at, 1, product)
    else products.value.push(product)
  }

  /** The glasses, and the products of the flight's pours (the catalogue itself is searched, never sent whole). */
  async function loadOptions(fetcher: typeof $fetch, view: FlightView | null) {
    const ids = [...new Set(view?.pours.map(p => p.productId) ?? [])]
    const [p, g] = await Promise.all([
      ids.length ? fetcher<ProductPage>('/api/products', { query: { ids: ids.join(','), pageSize: ids.length } }) : null,
      fetcher<GlassView[]>('/api/glasses'),
    ])
    products.value = p?.items ?? []
    glasses.value = g
  }

  /** Loads the flight (or starts a new one); `fetcher` is the request-aware $fetch during SSR. */
  async function start(flightId: number | null, fetcher: typeof $fetch = $fetch) {
    // Arriving at the page of the flight just saved keeps the "Saved." message.
    if (flightId === null || flightId !== id.value) {
      errors.value = {}
      message.value = ''
      error.value = ''
    }
    const view = flightId ? await fetcher<FlightView>(`/api/flights/${flightId}`) : null
    await loadOptions(fetcher, view)
    if (view) fromView(view)
    else {
      id.value = null
      name.value = ''
      summary.value = ''
      status.value = 'draft'
      version.value = 1
      locked.value = false
      sessionCount.value = 0
      pours.value = []
      preview.value = null
      dirty.value = false
    }
  }

  function changed() {
    dirty.value = true
    schedulePreview()
  }

  function addPour(product: ProductListItem) {
    if (product.status !== 'active' || !canAddPour.value) return
    remember(product)
    const productId = product.id
    const glass = glasses.value.find(g => GLASS_FOR_KIND[product.kind].test(g.name)) ?? glasses.value[0]
    if (!glass) return
    pours.value.push({ key: nextKey++, productId, volumeMl: DEFAULT_TASTING_POUR_ML[product.kind], glassId: glass.id, servingTempC: product.servingTempC, note: null })
    changed()
  }

  function removePour(index: number) {
    pours.value.splice(index, 1)
    changed()
  }

  /** Moves a pour from one place to another (buttons move by one, drag and drop anywhere). */
  function movePour(from: number, to: number) {
    if (to < 0 || to >= pours.value.length || from === to) return
    const [p] = pours.value.splice(from, 1)
    pours.value.splice(to, 0, p!)
    changed()
  }

  let timer: ReturnType<typeof setTimeout> | undefined
  let seq = 0
  function schedulePreview() {
    clearTimeout(timer)
    timer = setTimeout(runPreview, 250)
  }

  async function runPreview() {
    if (!pours.value.length) {
      preview.value = null
      return
    }
    const mine = ++seq
    try {
      const result = await $fetch<FlightPreview>('/api/flights/preview', { method: 'POST', body: { pours: pours.value.map(strip) } })
      if (mine === seq) {
        preview.value = result
        previewError.value = ''
      }
    }
    catch (err) {
      if (mine === seq) previewError.value = readServerError(err).message
    }
  }

  const strip = ({ key, ...p }: BuilderPour) => p

  async function act(fn: () => Promise<FlightView>, done: string) {
    busy.value = true
    errors.value = {}
    message.value = ''
    error.value = ''
    try {
      const view = await fn()
      const wasNew = id.value !== view.id
      fromView(view)
      message.value = done
      if (wasNew) await navigateTo(`/manage/flights/${view.id}`, { replace: true })
    }
    catch (err) {
      const e = readServerError(err)
      errors.value = e.fields
      error.value = e.message
    }
    finally {
      busy.value = false
    }
  }

  const save = () => act(() => {
    const body = { name: name.value, summary: summary.value, ...(canEditPours.value ? { pours: pours.value.map(strip) } : {}) }
    return id.value
      ? $fetch<FlightView>(`/api/flights/${id.value}`, { method: 'PATCH', body })
      : $fetch<FlightView>('/api/flights', { method: 'POST', body: { ...body, pours: pours.value.map(strip) } })
  }, 'Saved.')
  const publish = () => act(() => $fetch<FlightView>(`/api/flights/${id.value}/publish`, { method: 'POST' }), 'Published: guests can now see this flight and sessions can be scheduled.')
  const unpublish = () => act(() => $fetch<FlightView>(`/api/flights/${id.value}/unpublish`, { method: 'POST' }), 'Back to draft.')
  const retire = () => act(() => $fetch<FlightView>(`/api/flights/${id.value}/retire`, { method: 'POST' }), 'Retired: no new sessions; scheduled ones keep it.')
  const revise = () => act(() => $fetch<FlightView>(`/api/flights/${id.value}/revise`, { method: 'POST' }), 'A new draft version: change it, then publish it to replace the old one for new sessions.')

  return {
    id, name, summary, status, version, locked, sessionCount, pours, preview, previewError, errors, message, error, busy, dirty,
    products, glasses, canEditPours, canAddPour,
    start, changed, remember, addPour, removePour, movePour, save, publish, unpublish, retire, revise,
  }
})
