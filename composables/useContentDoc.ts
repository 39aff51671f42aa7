import type { ContentKind } from '#shared/content'

export interface ContentDocView {
  id: number | null
  label: string
  title: string
  draftBody: string
  publishedBody: string | null
  status: 'draft' | 'published'
  publishedAt: string | null
  updatedAt: string | null
  isDefault: boolean
  defaultBody: string | null
}
export interface ContentRevision { id: number, action: 'save' | 'publish' | 'unpublish' | 'restore', title: string, body: string, createdAt: string, author: string | null }

/** One note or article in the editor: load, save the draft, publish, unpublish, restore. */
export function useContentDoc(kind: ContentKind, subject: string) {
  const base = `/api/content/${kind}/${subject}`
  const doc = useFetch<ContentDocView>(base, { key: `content-${kind}-${subject}` })
  const revisions = useFetch<ContentRevision[]>(`${base}/revisions`, { key: `content-rev-${kind}-${subject}`, default: () => [] })
  const message = ref('')
  const error = ref('')
  const busy = ref(false)

  async function act(path: string, method: 'PUT' | 'POST', body: Record<string, unknown> | undefined, done: string) {
    busy.value = true
    message.value = ''
    error.value = ''
    try {
      doc.data.value = await $fetch<ContentDocView>(path, { method, body })
      message.value = done
      await revisions.refresh()
    }
    catch (err) {
      error.value = readServerError(err).message
    }
    finally {
      busy.value = false
    }
  }

  return {
    /** Resolves once the document and its revisions are loaded (on the server, before rendering). */
    ready: Promise.all([doc, revisions]).then(() => undefined),
    doc: doc.data,
    revisions: revisions.data,
    message,
    error,
    busy,
    save: (title: string, body: string) => act(base, 'PUT', { title, body }, 'Draft saved. Guests still see the published text.'),
    publish: () => act(`${base}/publish`, 'POST', undefined, 'Published: guests, public pages and cards now show this text.'),
    unpublish: () => act(`${base}/unpublish`, 'POST', undefined, 'Taken off guest pages and cards. The draft is kept.'),
    restore: (revisionId: number) => act(`${base}/restore`, 'POST', { revisionId }, 'That version is back as the draft. Publish it to show it to guests.'),
  }
}
