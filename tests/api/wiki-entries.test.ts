import { describe, expect, it } from 'vitest'
import { createEntry, getEntry, newWikiTeam } from '../support/wiki'

describe('makers, materials and categories', async () => {
  const team = await newWikiTeam('Entries')

  it('stores a maker with other names, approximate years and tags, and filters makers', async () => {
    const id = await createEntry(team.editor, team, 'makers', {
      name: 'Larkspur Ceramics', otherNames: ['Larkspur & Co.', 'Larkspur Pottery Works'], country: 'Erland',
      yearFrom: 1890, yearFromApprox: true, yearTo: 1962, yearToApprox: false, notes: 'Family firm.', tags: ['Pottery'],
    })
    const other = await createEntry(team.editor, team, 'makers', { name: 'Quillon Glass', country: 'Norvale', tags: ['glass'] })
    const maker = await getEntry(team.viewer, team, 'makers', id)
    expect(maker).toMatchObject({
      id, type: 'maker', revision: 1, title: 'Larkspur Ceramics', name: 'Larkspur Ceramics', otherNames: ['Larkspur & Co.', 'Larkspur Pottery Works'],
      country: 'Erland', yearFrom: 1890, yearFromApprox: true, yearTo: 1962, yearToApprox: false, tags: ['pottery'],
      notesHtml: '<p>Family firm.</p>\n', marks: [], photos: [], backlinks: [],
    })
    const mark = await createEntry(team.editor, team, 'marks', { inscriptions: ['LARKSPUR'], makerId: id })
    expect((await getEntry(team.viewer, team, 'makers', id)).marks).toEqual([{ id: mark, title: 'LARKSPUR' }])

    const names = async (query: string) => ((await team.viewer.get(team.api(`/makers?${query}`))).body.items as { id: number }[]).map(m => m.id)
    expect(await names('country=Erland')).toEqual([id])
    expect(await names('tag=glass')).toEqual([other])
    expect(await names('q=pottery%20works')).toEqual([id])
    expect(await names('sort=-name')).toEqual([other, id])
    expect(await names('sort=name')).toEqual([id, other])
    expect((await team.viewer.get(team.api('/makers?sort=title'))).status).toBe(400)

    const bad = await team.editor.post(team.api('/makers'), { name: 'Backwards', yearFrom: 1950, yearTo: 1940 })
    expect(bad.status).toBe(400)
    expect(bad.body.fieldErrors.yearTo).toBeDefined()
    expect((await team.editor.post(team.api('/makers'), { name: '' })).status).toBe(400)
    expect((await team.editor.post(team.api('/makers'), {})).body.fieldErrors.name).toBeDefined()
    expect((await team.editor.post(team.api('/makers'), { name: 'x'.repeat(201) })).body.fieldErrors.name).toBeDefined()
  })

  it('stores a material with checks, sources and rendered markdown fields', async () => {
    const id = await createEntry(team.editor, team, 'materials', {
      name: 'Milk glass', recognition: 'Opaque, **white** or coloured.', checks: { sound: 'A clear ring.', uvGlow: '' },
      damage: 'Chips lower value.', cautions: '', handbookPath: '/handbook/materials/glass', sources: ['common practice', 'common practice'],
      tags: ['glass'],
    })
    const material = await getEntry(team.viewer, team, 'materials', id)
    expect(material).toMatchObject({
      id, type: 'material', title: 'Milk glass', recognitionHtml: '<p>Opaque, <strong>white</strong> or coloured.</p>\n',
      checks: { weight: '', sound: 'A clear ring.', touch: '', seams: '', uvGlow: '', translucency: '' },
      damageHtml: '<p>Chips lower value.</p>\n', cautionsHtml: '', handbookPath: '/handbook/materials/glass', sources: ['common practice'],
    })
    expect((await team.viewer.get(team.api('/materials?q=milk'))).body.items.map((m: { id: number }) => m.id)).toEqual([id])
    expect((await team.editor.post(team.api('/materials'), { name: 'Bad path', handbookPath: 'javascript:alert(1)' })).status).toBe(400)
    expect((await team.editor.post(team.api('/materials'), { name: 'Off-site path', handbookPath: '//elsewhere.example/page' })).status).toBe(400)
    expect((await team.editor.post(team.api('/materials'), { name: 'Long check', checks: { weight: 'x'.repeat(1001) } })).status).toBe(400)
  })

  it('builds a category tree and lists by parent', async () => {
    const root = await createEntry(team.editor, team, 'categories', { name: 'Glassware' })
    const mid = await createEntry(team.editor, team, 'categories', { name: 'Drinking glasses', parentId: root })
    const leaf = await createEntry(team.editor, team, 'categories', { name: 'Tumblers', parentId: mid })
    expect(await getEntry(team.viewer, team, 'categories', leaf)).toMatchObject({
      parentId: mid, parent: { id: mid, name: 'Drinking glasses' }, path: [{ id: root, name: 'Glassware' }, { id: mid, name: 'Drinking glasses' }], children: [],
    })
    expect((await getEntry(team.viewer, team, 'categories', root)).children).toEqual([{ id: mid, name: 'Drinking glasses' }])
    const children = await team.viewer.get(team.api(`/categories?parentId=${root}`))
    expect(children.body.items.map((c: { id: number }) => c.id)).toEqual([mid])
    const roots = (await team.viewer.get(team.api('/categories?parentId=root&pageSize=100'))).body.items.map((c: { id: number }) => c.id)
    expect(roots).toContain(root)
    expect(roots).not.toContain(mid)
    expect((await team.viewer.get(team.api('/categories?parentId=nope'))).status).toBe(400)
  })

  it('refuses a category move that would make a cycle', async () => {
    const a = await createEntry(team.editor, team, 'categories', { name: 'Cycle A' })
    const b = await createEntry(team.editor, team, 'categories', { name: 'Cycle B', parentId: a })
    const c = await createEntry(team.editor, team, 'categories', { name: 'Cycle C', parentId: b })
    const self = await team.editor.patch(team.api(`/categories/${a}`), { revision: 1, parentId: a })
    expect(self.status).toBe(400)
    expect(self.body.fieldErrors.parentId[0]).toMatch(/own parent/)
    const loop = await team.editor.patch(team.api(`/categories/${a}`), { revision: 1, parentId: c })
    expect(loop.status).toBe(400)
    expect(loop.body.fieldErrors.parentId[0]).toMatch(/under itself/)
    const direct = await team.editor.patch(team.api(`/categories/${a}`), { revision: 1, parentId: b })
    expect(direct.status).toBe(400)
    expect((await getEntry(team.viewer, team, 'categories', a))).toMatchObject({ revision: 1, parentId: null })
    // Moving a leaf elsewhere is fine, and then the old loop is allowed.
    expect((await team.editor.patch(team.api(`/categories/${c}`), { revision: 1, parentId: null })).status).toBe(200)
    expect((await team.editor.patch(team.api(`/categories/${a}`), { revision: 1, parentId: c })).status).toBe(200)
    expect((await team.editor.post(team.api('/categories'), { name: 'Orphan', parentId: 999_999_999 })).body.fieldErrors.parentId).toBeDefined()
  })

  it('refuses two concurrent moves that together would make a cycle', async () => {
    for (let round = 0; round < 3; round++) {
      const x = await createEntry(team.editor, team, 'categories', { name: `Race X ${round}` })
      const y = await createEntry(team.editor, team, 'categories', { name: `Race Y ${round}` })
      const [first, second] = await Promise.all([
        team.editor.patch(team.api(`/categories/${x}`), { revision: 1, parentId: y }),
        team.owner.patch(team.api(`/categories/${y}`), { revision: 1, parentId: x }),
      ])
      expect([first.status, second.status].sort()).toEqual([200, 400])
      const parents = [(await getEntry(team.viewer, team, 'categories', x)).parentId, (await getEntry(team.viewer, team, 'categories', y)).parentId]
      expect(parents.filter(p => p !== null)).toHaveLength(1)
    }
  })
})
