import type { InjectionKey } from 'vue'
import type { LabSheetImported } from '#shared/types/products'
import { LAB_SHEET_MAX_BYTES, type LabSheetCheck, type LabSheetKind, type LabSheetRow, type LabSheetStreamLine } from '#shared/labSheet'

type LabSheetPhase = 'choose' | 'checking' | 'checked' | 'importing' | 'imported'

/**
 * The lab-sheet import, step by step (the import page calls this once; its step components read
 * the same state with useLabSheetImportState): choose the kind and a CSV file (read in the browser), check
 * it on the server while its progress streams in, choose the rows from the preview, import them in
 * one go. Nothing is written until the last step, and then all chosen rows or none.
 */
function labSheetImport() {
  const nuxtApp = useNuxtApp()
  const sheet = ref<LabSheetKind>('products')
  const fileName = ref('')
  const csv = ref('')
  const phase = ref<LabSheetPhase>('choose')
  const progress = ref({ done: 0, total: 0 })
  const check = shallowRef<LabSheetCheck | null>(null)
  const selected = ref(new Set<number>())
  const error = ref('')
  const imported = ref(0)

  const rows = computed<LabSheetRow[]>(() => check.value?.rows ?? [])
  const validLines = computed(() => rows.value.filter(r => !Object.keys(r.errors).length).map(r => r.line))
  const validSet = computed(() => new Set(validLines.value))
  const errorCount = computed(() => rows.value.length - validLines.value.length)

  function reset() {
    phase.value = 'choose'
    check.value = null
    selected.value = new Set()
    progress.value = { done: 0, total: 0 }
    error.value = ''
  }

  function startOver() {
    reset()
    csv.value = ''
    fileName.value = ''
  }

  async function pickFile(file: File | null | undefined) {
    reset()
    csv.value = ''
    fileName.value = file?.name ?? ''
    if (!file) return
    if (file.size > LAB_SHEET_MAX_BYTES) {
      error.value = `This file is larger than ${LAB_SHEET_MAX_BYTES / 1024 / 1024} MB. Split it into smaller sheets.`
      return
    }
    csv.value = await file.text()
  }

  async function preview() {
    reset()
    if (!csv.value) {
      error.value = 'Choose a CSV file first.'
      return
    }
    phase.value = 'checking'
    try {
      const res = await fetch('/api/lab-sheets/check', {
        method: 'POST',
        headers: { 'content-type': 'application/json', 'accept': 'application/x-ndjson' },
        body: JSON.stringify({ sheet: sheet.value, csv: csv.value }),
      })
      if (!res.ok || !res.body) {
        const body = await res.json().catch(() => null) as { message?: string } | null
        throw new Error(body?.message ?? 'The sheet could not be checked. Please try again.')
      }
      await readNdjson<LabSheetStreamLine>(res.body, (line) => {
        if (line.type === 'progress') progress.value = { done: line.done, total: line.total }
        else if (line.type === 'error') throw new Error(line.message)
        else check.value = line.result
      })
      if (!check.value) throw new Error('The check ended early. Please try again.')
      selected.value = new Set(validLines.value)
      phase.value = 'checked'
    }
    catch (err) {
      error.value = (err as Error).message
      phase.value = 'choose'
    }
  }

  const isValid = (line: number) => validSet.value.has(line)
  function toggle(line: number, on: boolean) {
    const next = new Set(selected.value)
    if (on && isValid(line)) next.add(line)
    else next.delete(line)
    selected.value = next
  }
  const selectAllValid = () => (selected.value = new Set(validLines.value))
  const selectNone = () => (selected.value = new Set())

  async function commit() {
    error.value = ''
    if (!selected.value.size) {
      error.value = 'Choose at least one row to import.'
      return
    }
    phase.value = 'importing'
    try {
      const lines = [...selected.value].sort((a, b) => a - b)
      const res = await $fetch<LabSheetImported>('/api/lab-sheets', { method: 'POST', body: { sheet: sheet.value, csv: csv.value, lines } })
      imported.value = res.imported
      phase.value = 'imported'
      // The list is read afresh when next shown (it is paged on the server).
      nuxtApp.runWithContext(() => clearNuxtData(productsKey))
    }
    catch (err) {
      error.value = readServerError(err).message
      phase.value = 'checked'
    }
  }

  watch(sheet, () => {
    if (phase.value !== 'checking' && phase.value !== 'importing') reset()
  })

  return { sheet, fileName, csv, phase, progress, check, rows, selected, validLines, errorCount, error, imported, isValid, pickFile, preview, toggle, selectAllValid, selectNone, commit, reset, startOver }
}

type LabSheetImport = ReturnType<typeof labSheetImport>
const LAB_SHEET_IMPORT: InjectionKey<LabSheetImport> = Symbol('lab-sheet-import')

/** The import page starts one import and shares it with its step components. */
export function useLabSheetImport(): LabSheetImport {
  const state = labSheetImport()
  provide(LAB_SHEET_IMPORT, state)
  return state
}

export function useLabSheetImportState(): LabSheetImport {
  const state = inject(LAB_SHEET_IMPORT)
  if (!state) throw new Error('useLabSheetImportState() needs useLabSheetImport() in a parent component.')
  return state
}
