import type { ContentKind } from '#shared/content'
import type { ContentDocView, ContentRevision } from '#shared/types/content'

/** One note or article in the editor: load, save the draft, publish, unpublish, restore. */
export function useContentDoc(kind: ContentKind, subject: string) {
  const base = `/api/content/${kind}/${subject}`
  const doc = useFetch<ContentDocView>(base, { key: `content-${kind}-${subject}` })
  const revisions = useFetch<ContentRevision[]>(`${base}/revisions`, { key: `content-rev-${kind}-${subject}`, default: () => [] })
  const { busy, message, error, run } = useAction()

  const act = (path: string, method: 'PUT' | 'POST', body: Record<string, unknown> | undefined, done: string) => run(
    () => $fetch<ContentDocView>(path, { method, body }),
    done,
    async (view) => {
      doc.data.value = view
      await revisions.refresh()
    },
  )

  return {
    /** Resolves once both are loaded: await it before copying the draft into the inputs, so the server renders what the browser will. */
    ready: Promise.all([doc, revisions]),
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
