// The listing draft builder: title and description from the mark, maker, era, material, measurements and
// condition. Conversions beside the checks are by definition (25.4 mm to the inch, 453.59237 g to the
// pound, 16 oz to the pound); the names are invented demo entries.
import { describe, expect, it } from 'vitest'
import { buildListingDraft, eraText, LISTING_TITLE_MAX, measurementsText, weightText, type ListingDraftInput } from '#shared/ledger/listing-draft'

const full: ListingDraftInput = {
  title: 'Green matte vase',
  quantity: 1,
  category: { name: 'Vases' },
  mark: { title: 'Hollow Ridge ink stamp', inscriptions: ['HOLLOW RIDGE', 'HOLLOWBROOK ILL.'], markType: 'printed', colour: 'green', yearFrom: 1952, yearTo: 1958, country: 'USA' },
  maker: { name: 'Hollow Ridge Pottery', country: 'USA', yearFrom: 1931, yearTo: 1979 },
  material: { name: 'Earthenware' },
  condition: 'very_good',
  damageFlags: ['chip', 'crazing'],
  damageNotes: 'Small flake on the foot ring',
  weightGrams: 450,
  box: { lengthMm: 125, widthMm: 80, heightMm: 203 },
}

describe('listing draft', () => {
  it('builds the title from the maker, the item, the material and the era of the mark', () => {
    const draft = buildListingDraft(full)
    expect(draft.title).toBe('Hollow Ridge Pottery Green matte vase Earthenware 1950s')
    expect(draft.title.length).toBeLessThanOrEqual(LISTING_TITLE_MAX)
  })

  it('writes a description with the maker, the mark as inscribed, the era, material, measurements and condition', () => {
    const { description } = buildListingDraft(full)
    expect(description).toContain('Maker: Hollow Ridge Pottery (USA, 1931–1979)')
    expect(description).toContain('Mark on the base: "HOLLOW RIDGE" / "HOLLOWBROOK ILL." (printed in green)')
    expect(description).toContain('Era: 1950s, by the years this mark was used')
    expect(description).toContain('Material: Earthenware')
    expect(description).toContain('Category: Vases')
    // 125 mm = 12.5 cm = 4.92 in; 80 mm = 3.15 in; 203 mm = 7.99 in (÷ 25.4, one decimal).
    expect(description).toContain('Measurements: 12.5 × 8 × 20.3 cm (4.9 × 3.1 × 8 in)')
    // 450 g ÷ 28.349523125 g/oz = 15.87 oz.
    expect(description).toContain('Weight: 450 g (15.9 oz)')
    expect(description).toContain('Condition: Very good. Flaws: chip, crazing to the glaze. Small flake on the foot ring.')
    expect(description.endsWith('Please see the photos, which are part of the description.')).toBe(true)
  })

  it('says so when no damage was found, and leaves out what the item does not link to', () => {
    const { title, description } = buildListingDraft({ ...full, mark: null, maker: null, material: null, category: null, damageFlags: [], damageNotes: '', condition: 'excellent', box: null, weightGrams: null })
    expect(title).toBe('Green matte vase')
    expect(description).toContain('Condition: Excellent. No chips, cracks or repairs found.')
    for (const line of ['Maker:', 'Mark on the base:', 'Era:', 'Material:', 'Measurements:', 'Weight:']) expect(description).not.toContain(line)
  })

  it('falls back to the maker\'s years for the era when the mark has none', () => {
    const { description } = buildListingDraft({ ...full, mark: { ...full.mark!, yearFrom: null, yearTo: null } })
    expect(description).toContain('Era: 1931–1979, by the maker\'s years')
    // The maker's working life does not date the piece: it stays out of the title.
    expect(buildListingDraft({ ...full, mark: { ...full.mark!, yearFrom: null, yearTo: null } }).title).toBe('Hollow Ridge Pottery Green matte vase Earthenware')
  })

  it('counts a set and does not repeat a maker the title already names', () => {
    const draft = buildListingDraft({ ...full, title: 'Hollow Ridge Pottery mugs', quantity: 4, material: null })
    expect(draft.title).toBe('Set of 4 Hollow Ridge Pottery mugs 1950s')
    expect(draft.description.startsWith('Hollow Ridge Pottery mugs (set of 4).')).toBe(true)
  })

  it('shortens a long title at a word boundary', () => {
    const long = buildListingDraft({ ...full, title: 'Large hand-thrown green matte vase with moulded leaves and a dry foot, heavy early body' })
    expect(long.title.length).toBeLessThanOrEqual(LISTING_TITLE_MAX)
    expect(long.title.startsWith('Hollow Ridge Pottery Large hand-thrown')).toBe(true)
    expect(long.title).not.toMatch(/\s$/)
    expect('Hollow Ridge Pottery Large hand-thrown green matte vase with moulded leaves and a dry foot, heavy early body Earthenware 1950s'.startsWith(long.title)).toBe(true)
  })

  it('is deterministic: the same item gives the same draft', () => {
    expect(buildListingDraft(full)).toEqual(buildListingDraft(structuredClone(full)))
  })
})

describe('listing draft pieces', () => {
  it('names an era by decade when both years fall in one, otherwise by its years', () => {
    expect(eraText(1952, 1958)).toBe('1950s')
    expect(eraText(1952, 1968)).toBe('1952–1968')
    expect(eraText(1960, 1960)).toBe('1960')
    expect(eraText(1947, null)).toBe('from 1947')
    expect(eraText(null, 1952)).toBe('until 1952')
    expect(eraText(null, null)).toBe('')
  })

  it('converts measurements and weights by definition', () => {
    expect(measurementsText({ lengthMm: 254, widthMm: 254, heightMm: 254 })).toBe('25.4 × 25.4 × 25.4 cm (10 × 10 × 10 in)')
    // 1,361 g ÷ 453.59237 = 3.0005 lb.
    expect(weightText(1361)).toBe('1.4 kg (3 lb)')
    expect(weightText(28)).toBe('28 g (1 oz)')
  })
})
