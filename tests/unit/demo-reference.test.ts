// The invented demo reference (Hollowbrook Finds): counts, unique keys, references between its
// lists, determinism, years that agree with the makers and with the dating clues on each mark,
// and a guard against real brand names slipping into the invented scenario.
import { describe, it, expect } from 'vitest'
import { buildDemoReference } from '../../server/database/seed/demo-reference'
import type { DemoMark, DemoReference } from '../../server/database/seed/demo-reference'
import { STARTER_MATERIALS } from '../../server/database/seed/materials'
import { findDatingClues } from '../../shared/dating'

const ref: DemoReference = buildDemoReference()
const makersByKey = new Map(ref.makers.map(maker => [maker.key, maker]))
const categoryKeys = new Set(ref.categories.map(category => category.key))
const markKeys = new Set(ref.marks.map(mark => mark.key))
const materialKeys = new Set(STARTER_MATERIALS.map(material => material.key))

const duplicates = (keys: string[]) => keys.filter((key, i) => keys.indexOf(key) !== i)

/** Every string anywhere in a value, for the brand-name guard. */
function strings(value: unknown): string[] {
  if (typeof value === 'string') return [value]
  if (Array.isArray(value)) return value.flatMap(strings)
  if (value && typeof value === 'object') return Object.values(value).flatMap(strings)
  return []
}

const fold = (text: string) => text.normalize('NFD').replace(/\p{M}/gu, '').toLowerCase()

/** Whether the mark's years lie inside the years the dating clues allow for `text`. */
function withinClues(mark: DemoMark, text: string): { ok: boolean, why: string } {
  const result = findDatingClues(text, mark.country)
  const { yearFrom, yearTo } = result.range
  const fromOk = yearFrom === null || (mark.yearFrom !== null && mark.yearFrom >= yearFrom)
  const toOk = yearTo === null || (mark.yearTo !== null && mark.yearTo <= yearTo)
  const why = `${mark.key} ${mark.yearFrom}–${mark.yearTo} vs ${JSON.stringify(text)} (${mark.country}): ${result.explanation}`
  return { ok: !result.conflict && fromOk && toOk, why }
}

describe('demo reference: counts', () => {
  it('has enough of everything', () => {
    expect(ref.categories.length).toBeGreaterThanOrEqual(20)
    expect(ref.makers.length).toBeGreaterThanOrEqual(60)
    expect(ref.marks.length).toBeGreaterThanOrEqual(200)
    expect(ref.lookalikes.length).toBeGreaterThanOrEqual(15)
    expect(ref.marks.filter(mark => mark.makerKey === null).length).toBeGreaterThanOrEqual(10)
  })

  it('gives every mark 2–4 distinct inscriptions, none empty', () => {
    for (const mark of ref.marks) {
      expect(mark.inscriptions.length, mark.key).toBeGreaterThanOrEqual(2)
      expect(mark.inscriptions.length, mark.key).toBeLessThanOrEqual(4)
      expect(new Set(mark.inscriptions).size, mark.key).toBe(mark.inscriptions.length)
      for (const text of mark.inscriptions) expect(text.trim().length, mark.key).toBeGreaterThan(0)
    }
  })

  it('gives every maker of a maker-attributed mark 2 or more marks', () => {
    for (const maker of ref.makers) {
      expect(ref.marks.filter(mark => mark.makerKey === maker.key).length, maker.key).toBeGreaterThanOrEqual(2)
    }
  })

  it('spreads the makers over the countries the team buys from', () => {
    const countries = new Set(ref.makers.map(maker => maker.country))
    for (const country of ['United States', 'England', 'Japan', 'West Germany', 'Czechoslovakia', 'Italy', 'China', 'Mexico', 'Sweden', 'USSR', 'Yugoslavia']) {
      expect(countries.has(country), country).toBe(true)
    }
  })

  it('includes names with diacritics, German-style spellings, "&" and "Co."', () => {
    const krausel = ref.makers.find(maker => maker.name === 'Kräusel Keramik')
    expect(krausel?.otherNames).toEqual(expect.arrayContaining(['Krausel Keramik', 'Kraeusel Keramik']))
    expect(ref.makers.some(maker => maker.name === 'Dunmore & Pell Pottery Co.')).toBe(true)
    expect(ref.makers.filter(maker => /[^\x20-\x7E]/.test(maker.name)).length).toBeGreaterThanOrEqual(8)
  })
})

describe('demo reference: keys and references', () => {
  it('has unique keys in every list', () => {
    expect(duplicates(ref.categories.map(c => c.key))).toEqual([])
    expect(duplicates(ref.makers.map(m => m.key))).toEqual([])
    expect(duplicates(ref.marks.map(m => m.key))).toEqual([])
  })

  it('uses kebab-case keys', () => {
    for (const key of [...categoryKeys, ...makersByKey.keys(), ...markKeys]) expect(key).toMatch(/^[a-z0-9]+(?:-[a-z0-9]+)*$/)
  })

  it('builds a category tree whose parents exist', () => {
    for (const category of ref.categories) {
      if (category.parentKey !== null) expect(categoryKeys.has(category.parentKey), category.key).toBe(true)
    }
    expect(ref.categories.filter(category => category.parentKey === null).map(c => c.key)).toEqual(
      expect.arrayContaining(['pottery', 'glass', 'kitchenware', 'decor', 'toys']),
    )
  })

  it('points every mark at a maker, categories and starter materials that exist', () => {
    for (const mark of ref.marks) {
      if (mark.makerKey !== null) expect(makersByKey.has(mark.makerKey), mark.key).toBe(true)
      expect(mark.categoryKeys.length, mark.key).toBeGreaterThan(0)
      expect(mark.materialKeys.length, mark.key).toBeGreaterThan(0)
      for (const key of mark.categoryKeys) expect(categoryKeys.has(key), `${mark.key}: ${key}`).toBe(true)
      for (const key of mark.materialKeys) expect(materialKeys.has(key), `${mark.key}: ${key}`).toBe(true)
    }
  })

  it('pairs look-alikes between existing, different marks, each pair once', () => {
    const pairs = ref.lookalikes.map(l => [l.markKey, l.otherMarkKey].sort().join(' | '))
    expect(duplicates(pairs)).toEqual([])
    for (const pair of ref.lookalikes) {
      expect(markKeys.has(pair.markKey), pair.markKey).toBe(true)
      expect(markKeys.has(pair.otherMarkKey), pair.otherMarkKey).toBe(true)
      expect(pair.markKey).not.toBe(pair.otherMarkKey)
      expect(pair.howToTell.length).toBeGreaterThan(40)
    }
  })

  it('puts another country on the look-alike than on the original', () => {
    const byKey = new Map(ref.marks.map(mark => [mark.key, mark]))
    for (const pair of ref.lookalikes) {
      expect(byKey.get(pair.markKey)!.country, pair.markKey).not.toBe(byKey.get(pair.otherMarkKey)!.country)
    }
  })
})

describe('demo reference: determinism', () => {
  it('builds the same reference on every call', () => {
    const again = buildDemoReference()
    expect(again).toEqual(ref)
    expect(again).not.toBe(ref)
  })
})

describe('demo reference: years', () => {
  it('keeps each mark\'s years ordered and inside its maker\'s years where both are known', () => {
    for (const mark of ref.marks) {
      if (mark.yearFrom !== null && mark.yearTo !== null) expect(mark.yearFrom, mark.key).toBeLessThanOrEqual(mark.yearTo)
      const maker = mark.makerKey ? makersByKey.get(mark.makerKey)! : null
      if (!maker) continue
      if (maker.yearFrom !== null && mark.yearFrom !== null) expect(mark.yearFrom, mark.key).toBeGreaterThanOrEqual(maker.yearFrom)
      if (maker.yearTo !== null) {
        expect(mark.yearTo, mark.key).not.toBeNull()
        expect(mark.yearTo!, mark.key).toBeLessThanOrEqual(maker.yearTo)
      }
    }
  })

  it('keeps each maker\'s years ordered', () => {
    for (const maker of ref.makers) {
      if (maker.yearFrom !== null && maker.yearTo !== null) expect(maker.yearFrom, maker.key).toBeLessThanOrEqual(maker.yearTo)
    }
  })

  it('has no dating-clue conflict on any mark, and the mark\'s years fit the clues', () => {
    const failures: string[] = []
    for (const mark of ref.marks) {
      // Each reading alone, and all of them together as one base read line by line.
      for (const text of [...mark.inscriptions, mark.inscriptions.join('\n')]) {
        const { ok, why } = withinClues(mark, text)
        if (!ok) failures.push(why)
      }
    }
    expect(failures).toEqual([])
  })

  it('exercises the dating clues the team meets at the shelf', () => {
    const rules = new Set(ref.marks.flatMap(mark => mark.inscriptions.flatMap(text => findDatingClues(text, mark.country).clues.map(c => c.rule))))
    for (const rule of ['japan', 'occupied-japan', 'west-germany', 'czechoslovakia', 'ussr', 'yugoslavia', 'china', 'made-in-england', 'registered-sign', 'reg-us-pat-off', 'reg-us-pat-tm-off', 'zip-code', 'zip-plus-4', 'state-code', 'postal-zone', 'microwave', 'oven-proof', 'dishwasher', 'upc-barcode', 'foreign']) {
      expect(rules.has(rule), rule).toBe(true)
    }
  })
})

// Well-known real names from the trade, written out here by hand. None may appear in the invented data.
const REAL_BRANDS = [
  'Roseville', 'McCoy', 'Haeger', 'Shawnee', 'Red Wing', 'Frankoma', 'Franciscan', 'Homer Laughlin', 'Fiesta',
  'Pfaltzgraff', 'Stangl', 'Hall China', 'Wedgwood', 'Royal Doulton', 'Spode', 'Royal Albert', 'Portmeirion',
  'Johnson Brothers', 'Royal Worcester', 'Noritake', 'Lenox', 'Mikasa', 'Hummel', 'Goebel', 'Lladro', 'Meissen',
  'Rosenthal', 'Hutschenreuther', 'Villeroy', 'Royal Copenhagen', 'Herend', 'Fenton', 'Westmoreland',
  'Anchor Hocking', 'Fire-King', 'Pyrex', 'Corning', 'CorningWare', 'Corelle', 'Blenko', 'Orrefors', 'Kosta Boda',
  'Iittala', 'Rorstrand', 'Gustavsberg', 'Holt Howard', 'Lefton', 'Enesco', 'Precious Moments', 'Department 56',
  'Tupperware', 'Le Creuset', 'Dansk', 'Fisher-Price', 'Tonka', 'Matchbox', 'Hot Wheels', 'Mattel', 'Hasbro',
  'Parker Brothers', 'Milton Bradley', 'Steiff', 'Schuco', 'Lionel', 'Madame Alexander',
]

describe('demo reference: invented names only', () => {
  it('names no real brand in any text field', () => {
    const texts = strings(ref).map(fold)
    const found: string[] = []
    for (const brand of REAL_BRANDS) {
      const escaped = fold(brand).replace(/[.*+?^${}()|[\]\\]/g, '\\$&')
      const pattern = new RegExp(`(?<![\\p{L}\\p{N}])${escaped}(?![\\p{L}\\p{N}])`, 'u')
      const hit = texts.find(text => pattern.test(text))
      if (hit) found.push(`${brand}: ${hit}`)
    }
    expect(found).toEqual([])
  })

  it('catches a brand name when one is there (the guard itself works)', () => {
    const pattern = new RegExp(`(?<![\\p{L}\\p{N}])${fold('Lladró')}(?![\\p{L}\\p{N}])`, 'u')
    expect(pattern.test(fold('a LLADRÓ-style figure'))).toBe(true)
    expect(pattern.test(fold('Lladronia'))).toBe(false)
  })
})
