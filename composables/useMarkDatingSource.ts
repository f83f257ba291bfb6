// The words of a chosen mark that the dating clues read (its inscriptions and country), for the quick add and
// the buy check. From the server, else from the phone's copy of the reference when there is no signal: the clue
// engine is pure shared code, so the clues still show at the shelf.
import type { MarkEntry } from '~~/shared/types/wiki'
import type { OfflineMark } from '~~/shared/offline/types'
import { offlineDb } from './offline/db'

export interface MarkDatingSource { inscriptions: string[], country: string }

async function fromDevice(slug: string, id: number): Promise<MarkDatingSource | null> {
  try {
    const row = await (await offlineDb()).get('entries', [slug, `mark:${id}`])
    const mark = row?.data as OfflineMark | undefined
    return mark ? { inscriptions: mark.inscriptions, country: mark.country } : null
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
      return { inscriptions: mark.inscriptions, country: mark.country }
    }
    catch (error) {
      if (import.meta.client && isNoAnswerError(error)) return await fromDevice(slug.value, markIdNow)
      return null
    }
  }, { default: () => null })
  return data
}
