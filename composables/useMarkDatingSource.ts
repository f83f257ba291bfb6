// A chosen mark's title and the words its dating clues read (inscriptions and country), for the quick add and
// the buy check. From the server, else from the phone's copy of the reference when there is no signal: the clue
// engine is pure shared code, so the clues still show at the shelf.
import type { MarkEntry } from '~~/shared/types/wiki'
import type { OfflineMark } from '~~/shared/offline/types'
import { offlineDb } from './offline/db'

export interface MarkDatingSource { title: string, inscriptions: string[], country: string }

async function fromDevice(slug: string, id: number): Promise<MarkDatingSource | null> {
  try {
    const row = await (await offlineDb()).get('entries', [slug, `mark:${id}`])
    const mark = row?.data as OfflineMark | undefined
    return mark ? { title: mark.title, inscriptions: mark.inscriptions, country: mark.country } : null
  }
  catch {
    return null
  }
}

export function useMarkDatingSource(markId: MaybeRefOrGetter<number | null | undefined>) {
  const { slug } = useTeam()
  const fetcher = useWikiFetch()
  const id = computed(() => toValue(markId) || null)
  const { data } = useAsyncData(() => `mark-dating-${slug.value}-${id.value ?? 'none'}`, async (): Promise<MarkDatingSource | null> => {
    const markIdNow = id.value
    if (!markIdNow) return null
    try {
      const mark = await fetcher<MarkEntry>(`/api/teams/${encodeURIComponent(slug.value)}/marks/${markIdNow}`)
      return { title: mark.title, inscriptions: mark.inscriptions, country: mark.country }
    }
    catch (error) {
      if (import.meta.client && isNoAnswerError(error)) return await fromDevice(slug.value, markIdNow)
      return null
    }
  })
  // No `default`: while the app hydrates a page the phone kept for another address (no signal), a default value
  // would read as data from the server and the handler would never run, so the clues would not show.
  return data
}
