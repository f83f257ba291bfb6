// The editor of any wiki entry: the draft, client checks with the server's own zod schemas, saving with the
// revision the edit started from, and the merge when someone saved in between. The typed text is kept
// through every step (and in this device's storage until it is saved or thrown away).
import type { InjectionKey, Ref } from 'vue'
import type { z } from 'zod'
import {
  categoryCreateSchema, categoryPatchSchema, makerCreateSchema, makerPatchSchema, markCreateSchema, markPatchSchema,
  materialCreateSchema, materialPatchSchema, type WikiContentByType, type WikiEntryType,
} from '~~/shared/schemas/wiki'
import type { EntryPhoto } from '~~/shared/photos'
import type { WikiConflictBody, WikiEntryByType, WikiSaved } from '~~/shared/types/wiki'

const SCHEMAS: Record<WikiEntryType, { create: z.ZodType, patch: z.ZodType }> = {
  mark: { create: markCreateSchema, patch: markPatchSchema },
  maker: { create: makerCreateSchema, patch: makerPatchSchema },
  material: { create: materialCreateSchema, patch: materialPatchSchema },
  category: { create: categoryCreateSchema, patch: categoryPatchSchema },
}

/** List fields whose blank rows are dropped before saving (they are just unused input rows). */
const LIST_FIELDS: Record<WikiEntryType, string[]> = {
  mark: ['inscriptions'],
  maker: ['otherNames'],
  material: ['sources'],
  category: [],
}

export type WikiFieldErrors = Record<string, string[]>

export interface WikiEditorContext<T extends WikiEntryType = WikiEntryType> {
  type: T
  entryId: number | null
  draft: Ref<WikiContentByType[T]>
  fieldError: (key: string) => string | undefined
  /** Messages for a field and everything under it ("materialIds", "materialIds.0" ...). */
  errorsUnder: (prefix: string) => string[]
  /** The DOM id of a field's input, for labels and the error summary's links. */
  inputId: (key: string) => string
  label: (type: WikiEntryType, id: number) => string
  setLabel: (type: WikiEntryType, id: number, title: string) => void
}

export const WIKI_EDITOR: InjectionKey<WikiEditorContext> = Symbol('wiki-editor')

/** For the per-type field components inside WikiEditorShell. */
export function useWikiEditorContext<T extends WikiEntryType>(_type: T): WikiEditorContext<T> {
  const context = inject(WIKI_EDITOR, null)
  if (!context) throw new Error('Wiki field components belong inside WikiEditorShell.')
  return context as unknown as WikiEditorContext<T>
}

export const wikiInputId = (key: string) => `wiki-${key.replace(/\./g, '-')}`

function zodErrors(error: z.ZodError): WikiFieldErrors {
  const out: WikiFieldErrors = {}
  for (const issue of error.issues) (out[issue.path.length ? issue.path.join('.') : '_'] ??= []).push(issue.message)
  return out
}

interface StoredDraft<C> { draft: C, base: C, baseRevision: number, labels: Record<string, string>, at: string }

export interface WikiConflict<T extends WikiEntryType> { current: WikiEntryByType[T], message: string }

/**
 * Synchronous on purpose (hooks and provide need the component's setup context): the shell awaits the
 * entry with useWikiEntry first and passes it in; null for a new entry.
 */
export function useWikiEditor<T extends WikiEntryType>(type: T, id: number | null, loadedEntry: WikiEntryByType[T] | null, options: {
  prefill?: Partial<WikiContentByType[T]>
  /** Re-reads the entry after a save (the shell passes its useWikiEntry refresh). */
  refreshEntry?: () => Promise<unknown>
} = {}) {
  const prefill = options.prefill ?? {}
  type C = WikiContentByType[T]
  const { slug } = useTeam()
  const api = useWikiApiPath()
  const paths = useWikiPaths()
  const entry = computed(() => loadedEntry)

  function initialContent(): C {
    const content = entry.value ? wikiContentOf(type, entry.value) : { ...wikiClone(WIKI_EMPTY[type]), ...wikiClone(prefill) } as C
    const record = content as Record<string, unknown>
    // A mark always shows one inscription row to type into.
    if (type === 'mark' && !(record.inscriptions as string[]).length) record.inscriptions = ['']
    return content
  }

  const start = initialContent()
  const base = ref(wikiClone(start)) as Ref<C>
  const baseRevision = ref(entry.value?.revision ?? 0)
  const draft = ref(wikiClone(start)) as Ref<C>
  const labels = reactive<Record<string, string>>(entry.value ? wikiRefLabels(entry.value) : {})
  const photos = ref<EntryPhoto[]>(entry.value?.photos ? [...entry.value.photos] : [])

  const clientErrors = ref<WikiFieldErrors>({})
  const problem = ref<ApiProblem | null>(null)
  const conflict = ref<WikiConflict<T> | null>(null) as Ref<WikiConflict<T> | null>
  const saving = ref(false)
  const finished = ref(false)
  const dirty = computed(() => !wikiSameValue(draft.value, base.value))

  const fieldErrors = computed<WikiFieldErrors>(() => Object.fromEntries(
    Object.entries({ ...clientErrors.value, ...problem.value?.fieldErrors }).map(([key, messages]) => [key, messages.map(wikiHumanMessage)]),
  ))
  const fieldError = (key: string) => fieldErrors.value[key]?.[0]

  const context: WikiEditorContext<T> = {
    type,
    entryId: id,
    draft,
    fieldError,
    errorsUnder: prefix => Object.entries(fieldErrors.value)
      .filter(([key]) => key === prefix || key.startsWith(`${prefix}.`)).flatMap(([, messages]) => messages),
    inputId: wikiInputId,
    label: (refType, refId) => labels[`${refType}:${refId}`] ?? `${WIKI_TYPE_META[refType].noun} #${refId}`,
    setLabel: (refType, refId, title) => { labels[`${refType}:${refId}`] = title },
  }
  provide(WIKI_EDITOR, context as unknown as WikiEditorContext)

  // ---- The draft survives reloads and closed tabs on this device until it is saved or discarded.
  const storageKey = computed(() => `tm-wiki-draft:${slug.value}:${type}:${id ?? 'new'}`)
  const recovered = ref<StoredDraft<C> | null>(null) as Ref<StoredDraft<C> | null>
  let storeTimer: ReturnType<typeof setTimeout> | undefined
  function forgetStored() {
    clearTimeout(storeTimer)
    try { localStorage.removeItem(storageKey.value) }
    catch { /* storage may be unavailable (private mode): the draft then lives in memory only */ }
  }
  onMounted(() => {
    try {
      const raw = localStorage.getItem(storageKey.value)
      const stored = raw ? JSON.parse(raw) as StoredDraft<C> : null
      if (stored && !wikiSameValue(stored.draft, draft.value)) recovered.value = stored
    }
    catch { /* unreadable: ignore */ }
  })
  watch(draft, () => {
    if (!import.meta.client || finished.value || recovered.value) return
    clearTimeout(storeTimer)
    storeTimer = setTimeout(() => {
      if (recovered.value) return
      try {
        if (!dirty.value) return localStorage.removeItem(storageKey.value)
        const stored: StoredDraft<C> = { draft: draft.value, base: base.value, baseRevision: baseRevision.value, labels: { ...labels }, at: new Date().toISOString() }
        localStorage.setItem(storageKey.value, JSON.stringify(stored))
      }
      catch { /* full or unavailable */ }
    }, 400)
  }, { deep: true })
  function restoreRecovered() {
    const stored = recovered.value
    if (!stored) return
    draft.value = wikiClone(stored.draft)
    base.value = wikiClone(stored.base)
    baseRevision.value = stored.baseRevision
    Object.assign(labels, stored.labels)
    recovered.value = null
  }
  function discardRecovered() {
    recovered.value = null
    forgetStored()
  }

  // ---- Leaving with unsaved text asks first.
  const leaveMessage = 'You have changes that are not saved. Leave this page anyway? (A copy stays on this device.)'
  onBeforeRouteLeave(() => {
    if (dirty.value && !finished.value && !window.confirm(leaveMessage)) return false
  })
  const onBeforeUnload = (event: BeforeUnloadEvent) => {
    if (dirty.value && !finished.value) event.preventDefault()
  }
  onMounted(() => window.addEventListener('beforeunload', onBeforeUnload))
  onBeforeUnmount(() => window.removeEventListener('beforeunload', onBeforeUnload))

  /** Drops blank rows of list fields from the draft itself, so error keys ("inscriptions.1") match the rows shown. */
  function tidy() {
    const record = draft.value as Record<string, unknown>
    for (const key of LIST_FIELDS[type]) {
      const rows = (record[key] as string[]).filter(v => v.trim() !== '')
      record[key] = rows.length || type !== 'mark' ? rows : ['']
    }
  }
  function sendable(): C {
    const content = wikiClone(draft.value) as Record<string, unknown>
    for (const key of LIST_FIELDS[type]) content[key] = (content[key] as string[]).filter(v => v.trim() !== '')
    return content as C
  }

  async function attachPendingPhotos(entryId: number) {
    const pending = photos.value
    await Promise.all(pending.map(p => apiFetch(`/api/teams/${slug.value}/photos/${p.id}`, { method: 'PATCH', body: { entityType: type, entityId: entryId } })))
  }

  const flash = useWikiFlash()
  async function finish(savedId: number, message: string) {
    finished.value = true
    forgetStored()
    flash.value = message
    // The entry page would otherwise show the copy this editor loaded (it shares the key while both are mounted).
    // (Not refreshNuxtData: it waits for an idle period first, which a covered window may not get for long.)
    await options.refreshEntry?.()
    await navigateTo(paths.entry(type, savedId))
  }

  /** Saves the draft: POST for a new entry, PATCH of the changed fields (with the base revision) otherwise. */
  async function save() {
    if (saving.value) return
    problem.value = null
    clientErrors.value = {}
    tidy()
    const content = sendable()
    const schemas = SCHEMAS[type]
    if (id === null) {
      const parsed = schemas.create.safeParse(content)
      if (!parsed.success) {
        clientErrors.value = zodErrors(parsed.error)
        return
      }
      saving.value = true
      try {
        const saved = await apiFetch<WikiSaved>(api(type), { method: 'POST', body: parsed.data })
        try {
          await attachPendingPhotos(saved.id)
        }
        catch (error) {
          // The entry exists now: open its editor so the photo can be added again there.
          finished.value = true
          forgetStored()
          problem.value = { ...toApiProblem(error), fieldErrors: {} }
          await navigateTo(paths.entry(type, saved.id, '/edit'))
          return
        }
        await finish(saved.id, `The ${WIKI_TYPE_META[type].noun} was added.`)
      }
      catch (error) {
        problem.value = toApiProblem(error)
      }
      finally {
        saving.value = false
      }
      return
    }
    const changed = wikiChangedContent(type, base.value, content)
    if (!Object.keys(changed).length) return await finish(id, 'Nothing had changed, so nothing new was saved.')
    const parsed = schemas.patch.safeParse({ revision: baseRevision.value, ...changed })
    if (!parsed.success) {
      clientErrors.value = zodErrors(parsed.error)
      return
    }
    saving.value = true
    try {
      const saved = await apiFetch<WikiSaved>(api(type, `/${id}`), { method: 'PATCH', body: parsed.data })
      await finish(saved.id, saved.revision === baseRevision.value ? 'Nothing had changed, so nothing new was saved.' : `Saved as revision ${saved.revision}.`)
    }
    catch (error) {
      const found = toApiProblem(error)
      if (found.statusCode === 409 && found.data.current) {
        // Nothing was saved: keep the draft as it is and show the merge screen.
        conflict.value = { current: (found.data as unknown as WikiConflictBody<WikiEntryByType[T]>).current, message: found.message }
        Object.assign(labels, wikiRefLabels(conflict.value.current))
      }
      else {
        problem.value = found
      }
    }
    finally {
      saving.value = false
    }
  }

  /**
   * Takes the merge screen's choices: the saved version becomes the base (with its revision), the chosen
   * values the draft. Then saves at once, or goes back to the form to edit further.
   */
  async function resolveConflict(choices: Record<string, unknown>, then: 'save' | 'edit') {
    const found = conflict.value
    if (!found) return
    const current = wikiContentOf(type, found.current)
    base.value = wikiClone(current)
    baseRevision.value = found.current.revision
    draft.value = { ...wikiClone(current), ...wikiClone(choices) } as C
    conflict.value = null
    if (then === 'save') await save()
  }

  // Photos are stored at once (they are not part of revisions): the entry page must see them too.
  async function uploaded(photo: EntryPhoto) {
    photos.value = [...photos.value, photo]
    if (id !== null) await options.refreshEntry?.()
  }
  async function removedPhoto(photoId: number) {
    photos.value = photos.value.filter(p => p.id !== photoId)
    if (id !== null) await options.refreshEntry?.()
  }

  return {
    type, id, entry, draft, base, baseRevision, labels, photos, fieldErrors, fieldError, problem, conflict,
    saving, dirty, recovered, save, resolveConflict, restoreRecovered, discardRecovered, uploaded, removedPhoto,
  }
}
