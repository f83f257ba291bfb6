// The 409 rule of ledger forms: an edit carries the revision it started from; when someone saved in
// between, the form keeps every typed value and the person chooses, field by field, between theirs and the
// saved version. Forms keep their values as strings (what the inputs hold), so one plan fits every form.

export type LedgerFormValues = Record<string, string>

export interface LedgerMergePlan {
  /** Fields only the other person changed: taken from the saved version without asking. */
  taken: string[]
  /** Fields both changed to different values: the person picks. */
  conflicts: string[]
}

export function ledgerMergePlan(base: LedgerFormValues, yours: LedgerFormValues, saved: LedgerFormValues): LedgerMergePlan {
  const taken: string[] = []
  const conflicts: string[] = []
  for (const key of Object.keys(yours)) {
    const mine = yours[key] !== base[key]
    const theirs = saved[key] !== base[key]
    if (theirs && !mine) taken.push(key)
    else if (mine && theirs && yours[key] !== saved[key]) conflicts.push(key)
  }
  return { taken, conflicts }
}

/** The fields of `yours` that differ from `from`: what a PATCH sends. */
export function ledgerChangedKeys(from: LedgerFormValues, yours: LedgerFormValues): string[] {
  return Object.keys(yours).filter(key => yours[key] !== from[key])
}

/**
 * State of one editable record: the values it started from, the revision, and the merge after a 409.
 * `toForm` turns the record as the API sends it into the form's strings.
 */
export function useLedgerEdit<R extends { revision: number }>(toForm: (record: R) => LedgerFormValues) {
  const base = ref<LedgerFormValues>({})
  const draft = ref<LedgerFormValues>({})
  const revision = ref(0)
  const merge = ref<{ saved: LedgerFormValues, plan: LedgerMergePlan, picks: Record<string, 'yours' | 'saved'>, savedRevision: number } | null>(null)

  function start(record: R) {
    base.value = toForm(record)
    draft.value = { ...base.value }
    revision.value = record.revision
    merge.value = null
  }
  /** After a 409: takes the other person's changes where the draft did not touch them, asks about the rest. */
  function conflict(current: R) {
    const saved = toForm(current)
    const plan = ledgerMergePlan(base.value, draft.value, saved)
    for (const key of plan.taken) draft.value[key] = saved[key] ?? ''
    merge.value = { saved, plan, picks: Object.fromEntries(plan.conflicts.map(key => [key, 'yours' as const])), savedRevision: current.revision }
  }
  /** Applies the choices: the draft now holds the merged values, based on the saved revision. */
  function resolve() {
    const m = merge.value
    if (!m) return
    for (const key of m.plan.conflicts) if (m.picks[key] === 'saved') draft.value[key] = m.saved[key] ?? ''
    base.value = m.saved
    revision.value = m.savedRevision
    merge.value = null
  }
  const changed = computed(() => ledgerChangedKeys(base.value, draft.value))
  return { base, draft, revision, merge, start, conflict, resolve, changed }
}
