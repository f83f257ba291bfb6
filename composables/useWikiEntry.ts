// One wiki entry and what hangs off it: its notes timeline, the cautions of a mark's materials, deleting it.
import type { AsyncData, NuxtError } from '#app'
import type { WikiEntryType } from '~~/shared/schemas/wiki'
import type { MaterialEntry, WikiEntryByType, WikiNote, WikiNoteCreateInput, WikiNotePatchInput } from '~~/shared/types/wiki'

export const wikiEntryKey = (type: WikiEntryType, id: number) => `wiki-entry-${type}-${id}`

/** The entry as GET /<type>s/<id> answers it; `error.statusCode` 404 when it does not exist (or was deleted). */
export function useWikiEntry<T extends WikiEntryType>(type: T, id: number): AsyncData<WikiEntryByType[T] | undefined, NuxtError | undefined> {
  const fetcher = useWikiFetch()
  const api = useWikiApiPath()
  // Typed by hand: with a generic entry type, useAsyncData's "pick" typing cannot resolve and hides every field.
  return useAsyncData(wikiEntryKey(type, id), () => fetcher<WikiEntryByType[T]>(api(type, `/${id}`))) as unknown as AsyncData<WikiEntryByType[T] | undefined, NuxtError | undefined>
}

/** The dated notes under an entry, newest first, with add / edit / remove. */
export function useWikiNotes(type: WikiEntryType, id: number) {
  const fetcher = useWikiFetch()
  const api = useWikiApiPath()
  const result = useAsyncData(`wiki-notes-${type}-${id}`, () => fetcher<{ items: WikiNote[] }>(api(type, `/${id}/notes`)))
  const notes = computed(() => result.data.value?.items ?? [])
  const pagePath = useRoute().fullPath
  /** With no signal the note waits on the phone (composables/useOfflineQueue.ts): then null. */
  async function add(input: WikiNoteCreateInput) {
    const sent = await offlineSendOrQueue<WikiNote>({ method: 'POST', url: api(type, `/${id}/notes`), body: input, label: `Note on this ${type}`, pagePath })
    if (sent.queued) return null
    await result.refresh()
    return sent.result
  }
  async function edit(noteId: number, input: WikiNotePatchInput) {
    const note = await apiFetch<WikiNote>(api(type, `/${id}/notes/${noteId}`), { method: 'PATCH', body: input })
    await result.refresh()
    return note
  }
  async function remove(noteId: number) {
    await apiFetch(api(type, `/${id}/notes/${noteId}`), { method: 'DELETE' })
    await result.refresh()
  }
  return wikiAwaitable(result, { notes, add, edit, remove })
}

/** The materials of a mark with their cautions (lead glazes, uranium glass ...), for the mark page. */
export function useWikiMaterialCautions(markId: number, materialIds: () => number[]) {
  const fetcher = useWikiFetch()
  const api = useWikiApiPath()
  const { data } = useAsyncData(`wiki-mark-${markId}-materials`, async () => {
    const ids = materialIds()
    const found = await Promise.all(ids.map(id => fetcher<MaterialEntry>(api('material', `/${id}`)).catch(() => null)))
    return found.filter((m): m is MaterialEntry => m !== null)
  }, { watch: [() => materialIds().join(',')] })
  return computed(() => data.value ?? [])
}

/** Soft delete (editor+): the entry moves to Recently deleted. */
export function useWikiDelete() {
  const api = useWikiApiPath()
  return async (type: WikiEntryType, id: number) => {
    await apiFetch(api(type, `/${id}`), { method: 'DELETE' })
  }
}

/** A one-time message for the next page ("Saved as revision 3."), cleared when that page is left. */
export const useWikiFlash = () => useState<string | null>('wiki-flash', () => null)
