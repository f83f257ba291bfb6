import { beforeAll, describe, expect, it } from 'vitest'
import { newOwner, uniqueTeamName } from '../support/api'
import { createEntry, getEntry, newWikiTeam, type WikiTeam } from '../support/wiki'

describe('marks: create, read, list', async () => {
  const team: WikiTeam = await newWikiTeam('Marks')
  let makerA: number, makerB: number, glass: number, china: number, tableware: number, teacups: number
  let m1: number, m2: number, m3: number, m4: number

  beforeAll(async () => {
    makerA = await createEntry(team.editor, team, 'makers', { name: 'Fernwood Pottery', country: 'Erland' })
    makerB = await createEntry(team.editor, team, 'makers', { name: 'Brackwater Glassworks', country: 'Norvale' })
    glass = await createEntry(team.editor, team, 'materials', { name: 'Pressed glass' })
    china = await createEntry(team.editor, team, 'materials', { name: 'Bone china' })
    tableware = await createEntry(team.editor, team, 'categories', { name: 'Tableware' })
    teacups = await createEntry(team.editor, team, 'categories', { name: 'Teacups', parentId: tableware })
    m1 = await createEntry(team.editor, team, 'marks', {
      inscriptions: ['FERNWOOD', 'HAND PAINTED', 'MADE IN ERLAND'], makerId: makerA, markType: 'printed', colour: 'blue', position: 'centre of base',
      country: 'Erland', yearFrom: 1950, yearTo: 1960, dateConfidence: 'medium', materialIds: [china], categoryIds: [teacups],
      tags: ['Blue', 'crown ', 'blue'], notes: 'Crown above the name. **Common** on teacups.',
    })
    m2 = await createEntry(team.editor, team, 'marks', {
      title: 'Brackwater anchor', inscriptions: ['BRACKWATER'], makerId: makerB, markType: 'impressed', country: 'Norvale',
      yearFrom: 1970, yearTo: 1980, materialIds: [glass], categoryIds: [tableware], tags: ['anchor'],
    })
    m3 = await createEntry(team.owner, team, 'marks', { inscriptions: ['ERLAND 50% WOOL'], markType: 'printed', country: 'Erland', yearFrom: 1965, tags: ['blue'] })
    m4 = await createEntry(team.editor, team, 'marks', { inscriptions: ['UNDATED STAMP'], markType: 'paper_label' })
  })

  it('stores every field and answers the full mark JSON', async () => {
    const mark = await getEntry(team.viewer, team, 'marks', m1)
    expect(mark).toMatchObject({
      id: m1, type: 'mark', revision: 1, title: 'FERNWOOD', makerId: makerA, maker: { id: makerA, name: 'Fernwood Pottery' },
      inscriptions: ['FERNWOOD', 'HAND PAINTED', 'MADE IN ERLAND'], markType: 'printed', colour: 'blue', position: 'centre of base',
      country: 'Erland', yearFrom: 1950, yearTo: 1960, dateConfidence: 'medium', materialIds: [china], categoryIds: [teacups],
      lookalikes: [], tags: ['blue', 'crown'], notes: 'Crown above the name. **Common** on teacups.', photos: [], backlinks: [],
      createdBy: { name: 'Editor Person' },
    })
    expect(mark.notesHtml).toBe('<p>Crown above the name. <strong>Common</strong> on teacups.</p>\n')
    expect(new Date(mark.createdAt).getTime()).toBeGreaterThan(Date.now() - 60_000)
    expect(mark.updatedAt).toBeTruthy()
    expect(mark.deletedAt).toBeNull()
  })

  it('calls a mark without a title by its first inscription, and follows it when the inscriptions change', async () => {
    const id = await createEntry(team.editor, team, 'marks', { inscriptions: ['OLD WORDING'] })
    expect((await getEntry(team.editor, team, 'marks', id)).title).toBe('OLD WORDING')
    const res = await team.editor.patch(team.api(`/marks/${id}`), { revision: 1, inscriptions: ['NEW WORDING', 'SECOND LINE'] })
    expect(res.status).toBe(200)
    expect((await getEntry(team.editor, team, 'marks', id)).title).toBe('NEW WORDING')
    await team.editor.patch(team.api(`/marks/${id}`), { revision: 2, title: 'Chosen title' })
    await team.editor.patch(team.api(`/marks/${id}`), { revision: 3, inscriptions: ['THIRD WORDING'] })
    expect((await getEntry(team.editor, team, 'marks', id)).title).toBe('Chosen title')
    expect((await getEntry(team.editor, team, 'marks', m2)).title).toBe('Brackwater anchor')
  })

  async function ids(query: string): Promise<number[]> {
    const res = await team.viewer.get(team.api(`/marks?pageSize=100&${query}`))
    expect(res.status, JSON.stringify(res.body)).toBe(200)
    return (res.body.items as { id: number }[]).map(i => i.id).filter(id => [m1, m2, m3, m4].includes(id)).sort((a, b) => a - b)
  }

  it('filters by maker, country, mark type, material and tag', async () => {
    expect(await ids(`makerId=${makerA}`)).toEqual([m1])
    expect(await ids('country=Erland')).toEqual([m1, m3])
    expect(await ids('markType=impressed')).toEqual([m2])
    expect(await ids(`materialId=${glass}`)).toEqual([m2])
    expect(await ids('tag=blue')).toEqual([m1, m3])
    expect(await ids('tag=BLUE')).toEqual([m1, m3])
    expect(await ids('tag=blue&country=Erland&markType=printed&makerId=' + makerA)).toEqual([m1])
  })

  it('filters by category, subcategories included', async () => {
    expect(await ids(`categoryId=${teacups}`)).toEqual([m1])
    expect(await ids(`categoryId=${tableware}`)).toEqual([m1, m2])
  })

  it('filters by a year inside the range; open-ended ranges count, undated marks do not', async () => {
    expect(await ids('year=1955')).toEqual([m1])
    expect(await ids('year=1975')).toEqual([m2, m3])
    expect(await ids('year=1962')).toEqual([])
    expect(await ids('year=1900')).toEqual([])
  })

  it('searches titles and inscriptions with q, treating % and _ as plain characters', async () => {
    expect(await ids('q=hand%20paint')).toEqual([m1])
    expect(await ids('q=anchor')).toEqual([m2])
    expect(await ids('q=50%25')).toEqual([m3])
    expect(await ids('q=%25')).toEqual([m3])
    expect(await ids('q=_')).toEqual([])
  })

  it('sorts by whitelisted fields, ascending and descending', async () => {
    const titles = async (sort: string) => ((await team.viewer.get(team.api(`/marks?pageSize=100&sort=${sort}`))).body.items as { title: string }[]).map(i => i.title)
    const asc = await titles('title')
    expect(asc).toEqual([...asc].sort((a, b) => a.localeCompare(b, 'en', { sensitivity: 'base' })))
    expect(await titles('-title')).toEqual([...asc].reverse())
    const byYear = (await team.viewer.get(team.api('/marks?pageSize=100&sort=-yearFrom'))).body.items as { id: number, yearFrom: number | null }[]
    expect(byYear.slice(0, 3).map(i => i.id)).toEqual([m2, m3, m1])
    const bad = await team.viewer.get(team.api('/marks?sort=notes'))
    expect(bad.status).toBe(400)
    expect(bad.body.fieldErrors.sort).toBeDefined()
  })

  it('pages through results with total, page and pageSize', async () => {
    const all = (await team.viewer.get(team.api('/marks?pageSize=100&sort=title'))).body
    expect(all.total).toBe(all.items.length)
    expect(all.total).toBeGreaterThanOrEqual(5)
    const seen: number[] = []
    for (let page = 1; page <= Math.ceil(all.total / 2); page++) {
      const res = await team.viewer.get(team.api(`/marks?pageSize=2&page=${page}&sort=title`))
      expect(res.body).toMatchObject({ total: all.total, page, pageSize: 2 })
      expect(res.body.items.length).toBe(Math.min(2, all.total - (page - 1) * 2))
      seen.push(...res.body.items.map((i: { id: number }) => i.id))
    }
    expect(seen).toEqual(all.items.map((i: { id: number }) => i.id))
    const beyond = await team.viewer.get(team.api('/marks?pageSize=2&page=99'))
    expect(beyond.body.items).toEqual([])
    expect(beyond.body.total).toBe(all.total)
  })

  it('defaults to 25 a page and refuses more than 100', async () => {
    const res = await team.viewer.get(team.api('/marks'))
    expect(res.body).toMatchObject({ page: 1, pageSize: 25 })
    expect((await team.viewer.get(team.api('/marks?pageSize=100'))).status).toBe(200)
    const tooMany = await team.viewer.get(team.api('/marks?pageSize=101'))
    expect(tooMany.status).toBe(400)
    expect(tooMany.body.fieldErrors.pageSize[0]).toMatch(/at most 100/)
    expect((await team.viewer.get(team.api('/marks?page=0'))).status).toBe(400)
    expect((await team.viewer.get(team.api('/marks?markType=stamped'))).status).toBe(400)
  })

  it('refuses fields over their limits with field errors', async () => {
    const cases: [Record<string, unknown>, string][] = [
      [{ inscriptions: ['A'], title: 'x'.repeat(201) }, 'title'],
      [{ inscriptions: ['x'.repeat(301)] }, 'inscriptions.0'],
      [{ inscriptions: Array.from({ length: 13 }, (_, i) => `LINE ${i}`) }, 'inscriptions'],
      [{ inscriptions: [] }, 'inscriptions'],
      [{ inscriptions: ['   '] }, 'inscriptions.0'],
      [{ inscriptions: ['A'], notes: 'x'.repeat(50_001) }, 'notes'],
      [{ inscriptions: ['A'], tags: Array.from({ length: 21 }, (_, i) => `t${i}`) }, 'tags'],
      [{ inscriptions: ['A'], tags: ['x'.repeat(41)] }, 'tags.0'],
      [{ inscriptions: ['A'], markType: 'stamped' }, 'markType'],
      [{ inscriptions: ['A'], dateConfidence: 'certain' }, 'dateConfidence'],
      [{ inscriptions: ['A'], yearFrom: 1990, yearTo: 1980 }, 'yearTo'],
      [{ inscriptions: ['A'], yearFrom: 'old' }, 'yearFrom'],
    ]
    for (const [body, field] of cases) {
      const res = await team.editor.post(team.api('/marks'), body)
      expect(res.status, `${field}: ${JSON.stringify(res.body).slice(0, 300)}`).toBe(400)
      expect(Object.keys(res.body.fieldErrors ?? {}), field).toContain(field)
      expect(res.body.message).toMatch(/check/i)
    }
    // At the limits exactly, it saves.
    const ok = await team.editor.post(team.api('/marks'), {
      title: 'x'.repeat(200), inscriptions: Array.from({ length: 12 }, () => 'y'.repeat(300)), notes: 'n'.repeat(50_000),
      tags: Array.from({ length: 20 }, (_, i) => `${i}`.padEnd(40, 'z')),
    })
    expect(ok.status, JSON.stringify(ok.body).slice(0, 300)).toBe(201)
  })

  it('refuses unknown, deleted or other teams\' makers, materials, categories and lookalikes', async () => {
    const other = await newOwner(uniqueTeamName('Other'))
    const otherApi = (p: string) => `/api/teams/${other.team.slug}${p}`
    const theirMaker = (await other.person.post(otherApi('/makers'), { name: 'Their Maker' })).body.id
    const theirMaterial = (await other.person.post(otherApi('/materials'), { name: 'Their Material' })).body.id
    const theirCategory = (await other.person.post(otherApi('/categories'), { name: 'Their Category' })).body.id
    const theirMark = (await other.person.post(otherApi('/marks'), { inscriptions: ['THEIRS'] })).body.id
    const gone = await createEntry(team.editor, team, 'makers', { name: 'Gone Maker' })
    expect((await team.editor.delete(team.api(`/makers/${gone}`))).status).toBe(200)
    const cases: [Record<string, unknown>, string][] = [
      [{ makerId: 999_999_999 }, 'makerId'],
      [{ makerId: theirMaker }, 'makerId'],
      [{ makerId: gone }, 'makerId'],
      [{ materialIds: [glass, theirMaterial] }, 'materialIds'],
      [{ categoryIds: [theirCategory] }, 'categoryIds'],
      [{ lookalikes: [{ markId: theirMark, howToTell: 'x' }] }, 'lookalikes.0.markId'],
      [{ lookalikes: [{ markId: m1, howToTell: '' }, { markId: 999_999_999, howToTell: '' }] }, 'lookalikes.1.markId'],
    ]
    for (const [body, field] of cases) {
      const res = await team.editor.post(team.api('/marks'), { inscriptions: ['REFS'], ...body })
      expect(res.status, field).toBe(400)
      expect(res.body.fieldErrors?.[field]?.[0], field).toMatch(/No (maker|material|category|mark) with id/)
    }
    const patched = await team.editor.patch(team.api(`/marks/${m4}`), { revision: 1, makerId: theirMaker })
    expect(patched.status).toBe(400)
    expect(patched.body.fieldErrors.makerId).toBeDefined()
    expect((await getEntry(team.editor, team, 'marks', m4)).revision).toBe(1)
  })

  it('shows a lookalike pair from both sides, and removes it from both', async () => {
    const a = await createEntry(team.editor, team, 'marks', { inscriptions: ['CROWN WARE'] })
    const b = await createEntry(team.editor, team, 'marks', {
      inscriptions: ['CROWN WEAR'], lookalikes: [{ markId: a, howToTell: 'The copy spells WEAR and has no dot under the crown.' }],
    })
    const seenFromA = await getEntry(team.viewer, team, 'marks', a)
    expect(seenFromA.lookalikes).toEqual([{
      markId: b, title: 'CROWN WEAR', howToTell: 'The copy spells WEAR and has no dot under the crown.',
      howToTellHtml: '<p>The copy spells WEAR and has no dot under the crown.</p>\n',
    }])
    // Saving a lookalike does not change the other mark's own revision.
    expect(seenFromA.revision).toBe(1)
    expect((await getEntry(team.viewer, team, 'marks', b)).lookalikes).toMatchObject([{ markId: a, title: 'CROWN WARE', howToTell: 'The copy spells WEAR and has no dot under the crown.' }])

    const c = await createEntry(team.editor, team, 'marks', { inscriptions: ['CROWN WARES'] })
    const fromA = await team.editor.patch(team.api(`/marks/${a}`), { revision: 1, lookalikes: [{ markId: b, howToTell: 'Spelling.' }, { markId: c, howToTell: 'Plural.' }] })
    expect(fromA.status).toBe(200)
    expect((await getEntry(team.viewer, team, 'marks', b)).lookalikes).toMatchObject([{ markId: a, title: 'CROWN WARE', howToTell: 'Spelling.' }])
    expect((await getEntry(team.viewer, team, 'marks', c)).lookalikes).toMatchObject([{ markId: a, title: 'CROWN WARE', howToTell: 'Plural.' }])

    const fromB = await team.editor.patch(team.api(`/marks/${b}`), { revision: 1, lookalikes: [] })
    expect(fromB.status).toBe(200)
    expect((await getEntry(team.viewer, team, 'marks', a)).lookalikes.map((l: { markId: number }) => l.markId)).toEqual([c])

    const self = await team.editor.patch(team.api(`/marks/${c}`), { revision: 1, lookalikes: [{ markId: c, howToTell: '' }] })
    expect(self.status).toBe(400)
    expect(self.body.fieldErrors['lookalikes.0.markId'][0]).toMatch(/own lookalike/)
    const twice = await team.editor.post(team.api('/marks'), { inscriptions: ['X'], lookalikes: [{ markId: a, howToTell: '' }, { markId: a, howToTell: '' }] })
    expect(twice.status).toBe(400)
  })

  it('records markdown links between entries and shows them as backlinks', async () => {
    const target = await createEntry(team.editor, team, 'marks', { inscriptions: ['LINK TARGET'] })
    const notes = `Same as [this mark](/t/${team.slug}/marks/${target}); not [theirs](/t/someone-else/marks/${target}).`
    const maker = await createEntry(team.editor, team, 'makers', { name: 'Linking Maker', notes })
    const material = await createEntry(team.editor, team, 'materials', { name: 'Linking Material', recognition: `See [mark][t].\n\n[t]: /t/${team.slug}/marks/${target}` })
    const backlinks = (await getEntry(team.viewer, team, 'marks', target)).backlinks
    expect(backlinks).toEqual([
      { type: 'maker', id: maker, title: 'Linking Maker' },
      { type: 'material', id: material, title: 'Linking Material' },
    ])
    // A link to an entry that does not exist in this team is not stored.
    const nowhere = await createEntry(team.editor, team, 'categories', { name: 'Nowhere', notes: `[x](/t/${team.slug}/marks/999999999)` })
    expect((await getEntry(team.viewer, team, 'categories', nowhere)).backlinks).toEqual([])

    // Removing the link removes the backlink; deleting the linking entry hides it.
    expect((await team.editor.patch(team.api(`/makers/${maker}`), { revision: 1, notes: 'No link now.' })).status).toBe(200)
    expect((await team.editor.delete(team.api(`/materials/${material}`))).status).toBe(200)
    expect((await getEntry(team.viewer, team, 'marks', target)).backlinks).toEqual([])
    expect((await team.editor.post(team.api(`/materials/${material}/restore`))).status).toBe(200)
    expect((await getEntry(team.viewer, team, 'marks', target)).backlinks).toEqual([{ type: 'material', id: material, title: 'Linking Material' }])
  })

  it('looks entries up by title for the link picker', async () => {
    const res = await team.viewer.get(team.api('/entries/lookup?q=fern'))
    expect(res.status).toBe(200)
    expect(res.body).toEqual(expect.arrayContaining([
      { type: 'maker', id: makerA, title: 'Fernwood Pottery', subtitle: 'Erland' },
      { type: 'mark', id: m1, title: 'FERNWOOD', subtitle: 'Fernwood Pottery · 1950–1960 · Erland' },
    ]))
    const onlyMarks = await team.viewer.get(team.api('/entries/lookup?q=fern&types=marks'))
    expect(onlyMarks.body.map((i: { type: string }) => i.type)).toEqual(['mark'])
    // Matches inside a title count; the subtitle of a category is its path.
    const cups = await team.viewer.get(team.api('/entries/lookup?q=cups&types=category,material'))
    expect(cups.body).toEqual([{ type: 'category', id: teacups, title: 'Teacups', subtitle: 'Tableware' }])
    // Titles that start with the text come first, whatever their type.
    const warehouse = await createEntry(team.editor, team, 'categories', { name: 'Warehouse finds' })
    const ware = (await team.viewer.get(team.api('/entries/lookup?q=ware'))).body as { id: number, title: string }[]
    expect(ware[0]).toMatchObject({ id: warehouse, title: 'Warehouse finds' })
    expect(ware.map(i => i.title)).toEqual(expect.arrayContaining(['Tableware', 'Warehouse finds']))
    const many = await team.viewer.get(team.api('/entries/lookup?q='))
    expect(many.body.length).toBeLessThanOrEqual(20)
    expect(many.body.length).toBeGreaterThan(10)
    expect((await team.viewer.get(team.api('/entries/lookup?types=items'))).status).toBe(400)
  })
})
