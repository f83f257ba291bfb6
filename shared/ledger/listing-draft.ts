// A listing draft for an item, assembled from what the team's reference already knows about it: the mark
// (its inscription and years), the maker, the material, the measurements and the condition notes. Plain
// text, ready to copy; the member edits it before posting. Pure and deterministic.

export interface ListingDraftMark {
  title: string
  inscriptions: string[]
  markType: string | null
  colour: string
  yearFrom: number | null
  yearTo: number | null
  country: string
}

export interface ListingDraftMaker {
  name: string
  country: string
  yearFrom: number | null
  yearTo: number | null
}

export interface ListingDraftInput {
  title: string
  quantity: number
  category: { name: string } | null
  mark: ListingDraftMark | null
  maker: ListingDraftMaker | null
  material: { name: string } | null
  condition: string | null
  damageFlags: string[]
  damageNotes: string
  weightGrams: number | null
  box: { lengthMm: number, widthMm: number, heightMm: number } | null
}

export interface ListingDraft { title: string, description: string }

/** Title length kept to 80 characters: our own choice, short enough for the channels the team uses. */
export const LISTING_TITLE_MAX = 80

const DAMAGE_WORDS: Record<string, string> = {
  chip: 'chip', crack: 'crack', hairline: 'hairline crack', crazing: 'crazing to the glaze', worn_gilding: 'worn gilding',
  worn_paint: 'worn paint', repair: 'old repair', missing_part: 'a missing part', stain: 'staining', other: 'other wear',
}

const CONDITION_WORDS: Record<string, string> = {
  new: 'New', excellent: 'Excellent', very_good: 'Very good', good: 'Good', fair: 'Fair', poor: 'Poor',
}

function words(text: string): string {
  return text.replace(/_/g, ' ').replace(/\s+/g, ' ').trim()
}

/** "1950s" when both years fall in one decade, "1952–1968" otherwise, "from 1952" / "until 1968" with one end. */
export function eraText(yearFrom: number | null, yearTo: number | null): string {
  if (yearFrom !== null && yearTo !== null) {
    if (yearFrom === yearTo) return String(yearFrom)
    if (Math.floor(yearFrom / 10) === Math.floor(yearTo / 10)) return `${Math.floor(yearFrom / 10) * 10}s`
    return `${yearFrom}–${yearTo}`
  }
  if (yearFrom !== null) return `from ${yearFrom}`
  if (yearTo !== null) return `until ${yearTo}`
  return ''
}

const oneDecimal = (value: number) => String(Math.round(value * 10) / 10)

/** "12.5 × 8 × 6 cm (4.9 × 3.1 × 2.4 in)" from whole millimetres (25.4 mm to the inch). */
export function measurementsText(box: { lengthMm: number, widthMm: number, heightMm: number }): string {
  const sides = [box.lengthMm, box.widthMm, box.heightMm]
  return `${sides.map(mm => oneDecimal(mm / 10)).join(' × ')} cm (${sides.map(mm => oneDecimal(mm / 25.4)).join(' × ')} in)`
}

/** "450 g (15.9 oz)"; 453.59237 g to the pound, 16 oz to the pound (exact definitions). */
export function weightText(grams: number): string {
  const ounces = grams / (453.59237 / 16)
  return grams >= 1000 ? `${oneDecimal(grams / 1000)} kg (${oneDecimal(ounces / 16)} lb)` : `${Math.round(grams)} g (${oneDecimal(ounces)} oz)`
}

function truncate(title: string, max: number): string {
  if (title.length <= max) return title
  const cut = title.slice(0, max + 1)
  const space = cut.lastIndexOf(' ')
  return (space > max / 2 ? cut.slice(0, space) : title.slice(0, max)).replace(/[\s,;:–-]+$/, '')
}

export function buildListingDraft(item: ListingDraftInput): ListingDraft {
  // The mark's years date the piece more closely than the maker's whole working life.
  const markEra = item.mark ? eraText(item.mark.yearFrom, item.mark.yearTo) : ''
  const era = markEra || (item.maker ? eraText(item.maker.yearFrom, item.maker.yearTo) : '')
  const makerName = item.maker?.name.trim() ?? ''
  const baseTitle = words(item.title)
  const titleParts: string[] = []
  if (item.quantity > 1) titleParts.push(`Set of ${item.quantity}`)
  // The maker leads unless the item's own title already names it.
  if (makerName && !baseTitle.toLowerCase().includes(makerName.toLowerCase())) titleParts.push(makerName)
  titleParts.push(baseTitle)
  const materialName = item.material?.name.trim() ?? ''
  if (materialName && !baseTitle.toLowerCase().includes(materialName.toLowerCase())) titleParts.push(materialName)
  if (markEra && !markEra.startsWith('from') && !markEra.startsWith('until')) titleParts.push(markEra)
  const title = truncate(titleParts.filter(Boolean).join(' '), LISTING_TITLE_MAX)

  const lines: string[] = [baseTitle + (item.quantity > 1 ? ` (set of ${item.quantity})` : '') + '.', '']
  if (item.maker) {
    const where = [item.maker.country.trim(), eraText(item.maker.yearFrom, item.maker.yearTo)].filter(Boolean).join(', ')
    lines.push(`Maker: ${makerName}${where ? ` (${where})` : ''}`)
  }
  if (item.mark) {
    const inscription = item.mark.inscriptions.map(text => `"${text}"`).join(' / ')
    const how = [item.mark.markType ? words(item.mark.markType) : '', item.mark.colour.trim() && !item.mark.colour.startsWith('none') ? `in ${item.mark.colour.trim()}` : '']
      .filter(Boolean).join(' ')
    lines.push(`Mark on the base: ${inscription || item.mark.title}${how ? ` (${how})` : ''}`)
  }
  if (era) lines.push(`Era: ${era}${markEra ? ', by the years this mark was used' : ', by the maker\'s years'}`)
  if (item.mark?.country.trim() && !item.maker?.country) lines.push(`Country on the mark: ${item.mark.country.trim()}`)
  if (materialName) lines.push(`Material: ${materialName}`)
  if (item.category) lines.push(`Category: ${item.category.name}`)
  if (item.box) lines.push(`Measurements: ${measurementsText(item.box)}`)
  if (item.weightGrams !== null && item.weightGrams > 0) lines.push(`Weight: ${weightText(item.weightGrams)}`)
  lines.push('')

  const condition = item.condition ? (CONDITION_WORDS[item.condition] ?? words(item.condition)) : ''
  const flaws = item.damageFlags.map(flag => DAMAGE_WORDS[flag] ?? words(flag))
  if (condition || flaws.length || item.damageNotes.trim()) {
    let text = `Condition: ${condition || 'see notes'}.`
    if (flaws.length) text += ` Flaws: ${flaws.join(', ')}.`
    else text += ' No chips, cracks or repairs found.'
    if (item.damageNotes.trim()) text += ` ${item.damageNotes.trim().replace(/\.?$/, '.')}`
    lines.push(text)
  }
  lines.push('Please see the photos, which are part of the description.')
  return { title, description: lines.join('\n').replace(/\n{3,}/g, '\n\n').trim() }
}
