// Checks the starter materials and the handbook pages against the published sources they name.
// The expected values below are written out independently of the code under test, each with its
// source in a comment beside it (as given in the team's trade-facts notes, sections 2, 3 and 6).
import { describe, it, expect } from 'vitest'
import { existsSync, readdirSync, readFileSync, statSync } from 'node:fs'
import { join, relative } from 'node:path'
import { STARTER_MATERIALS } from '../../server/database/seed/materials'
import type { StarterMaterial } from '../../server/database/seed/materials'

const ROOT = process.cwd()
const HANDBOOK = join(ROOT, 'content', 'handbook')

// The pages this suite is about.
const PAGES = [
  'index.md',
  'reading-a-base.md',
  'condition-and-grading.md',
  'safety.md',
  'materials/ceramics.md',
  'materials/glass.md',
  'materials/resin-and-wood.md',
  'materials/chalkware.md',
  'materials/plastic-and-metal.md',
]

// Every source name a fact may carry (trade-facts sections 2, 3, 6, plus the two honesty markers).
const KNOWN_SOURCES = [
  'common practice, no published source', // rule of thumb, no publication states it
  'from memory', // a value not checked against a copy
  'ASTM C373', // water absorption classes for ceramic tile
  'USDA Forest Products Laboratory Wood Handbook', // wood densities
  'British Standard BS 5416, from memory', // bone china, 30 % bone phosphate
  'Indian Standard IS 6988:2002', // bone china, 35 % bone ash
  'US FDA guidance on imported traditional pottery, Nov 2010', // lead and cadmium in glazes
  '21 CFR 109.16', // decorative ceramicware not for food use
  'US FDA leach limits for lead and cadmium', // the µg/mL table
  'US Tariff Act of 1 Oct 1890, the McKinley Tariff, section 6', // country of origin from 1 Mar 1891
]

// ---------- helpers ----------

interface Page {
  path: string
  data: Record<string, string | number | string[]>
  body: string
  raw: string
}

function unquote(value: string): string {
  const v = value.trim()
  if ((v.startsWith('"') && v.endsWith('"')) || (v.startsWith('\'') && v.endsWith('\''))) return v.slice(1, -1)
  return v
}

// A small reader for the flat front matter these pages use: `key: value` and `key:` + `  - item` lists.
function parseFrontMatter(raw: string): { data: Page['data'], body: string } {
  const match = /^---\r?\n([\s\S]*?)\r?\n---\r?\n?/.exec(raw)
  if (!match) return { data: {}, body: raw }
  const data: Page['data'] = {}
  let list: string | null = null
  for (const line of match[1]!.split(/\r?\n/)) {
    const item = /^\s+-\s+(.*)$/.exec(line)
    if (item && list) {
      (data[list] as string[]).push(unquote(item[1]!))
      continue
    }
    const pair = /^([A-Za-z][\w-]*):\s*(.*)$/.exec(line)
    if (!pair) continue
    const [, key, value] = pair as unknown as [string, string, string]
    if (value.trim() === '') {
      data[key] = []
      list = key
    }
    else {
      list = null
      data[key] = /^-?\d+(\.\d+)?$/.test(value.trim()) ? Number(value.trim()) : unquote(value)
    }
  }
  return { data, body: raw.slice(match[0].length) }
}

function readPage(path: string): Page {
  const raw = readFileSync(join(HANDBOOK, path), 'utf8')
  return { path, raw, ...parseFrontMatter(raw) }
}

function listMarkdown(dir: string): string[] {
  return readdirSync(dir).flatMap((name) => {
    const full = join(dir, name)
    if (statSync(full).isDirectory()) return listMarkdown(full)
    return name.endsWith('.md') ? [relative(HANDBOOK, full)] : []
  })
}

// Collapse whitespace and write every numeric range with an en dash, so "1.1-1.5" and "1.1–1.5" match.
function norm(text: string): string {
  return text.replace(/\s+/g, ' ').replace(/(\d)\s*[-‐‑‒–—]\s*(\d)/g, '$1–$2')
}

// Paragraphs of a markdown text, with list items, table rows and headings as units of their own.
function unitsOf(md: string): string[] {
  const units: string[] = []
  for (const block of md.split(/\r?\n\s*\r?\n/)) {
    let current = ''
    for (const line of block.split(/\r?\n/)) {
      if (/^\s*([-*|#>]|\d+\.)/.test(line)) {
        if (current) units.push(current)
        current = line.trim()
      }
      else {
        current = current ? `${current} ${line.trim()}` : line.trim()
      }
    }
    if (current) units.push(current)
  }
  return units.map(norm)
}

// Sentences of a markdown text (within the units above).
function sentencesOf(md: string): string[] {
  return unitsOf(md)
    .flatMap(unit => unit.split(/(?<=[.!?])\s+(?=[A-Z"*(])/))
    .map(s => s.trim())
    .filter(Boolean)
}

// Inline citations "(source: A; B)"; a quoted example such as '"(source: ...)"' is not a citation.
function inlineSources(text: string): string[] {
  const found: string[] = []
  for (const m of norm(text).matchAll(/(?<!")\(source: ([^()]+)\)/g)) {
    found.push(...m[1]!.split(';').map(s => s.trim()).filter(Boolean))
  }
  return found
}

function tableRows(md: string): string[][] {
  return md
    .split(/\r?\n/)
    .filter(line => /^\s*\|/.test(line) && !/^\s*\|[\s|:-]+\|\s*$/.test(line))
    .map(line => line.trim().replace(/^\||\|$/g, '').split('|').map(cell => norm(cell).trim()))
}

function materialText(m: StarterMaterial): string {
  return [m.name, m.recognition, ...Object.values(m.checks), m.damage, m.cautions, m.notes].join('\n')
}

function material(key: string): StarterMaterial {
  const found = STARTER_MATERIALS.find(m => m.key === key)
  if (!found) throw new Error(`no starter material ${key}`)
  return found
}

// A sentence that names a hot-needle or chemical test must warn against it, never recommend it.
const HOT_NEEDLE = /hot[\s-]?(needle|pin)/i
const CHEMICAL_TEST = /chemical tests?/i
const WARNS = /\b(never|not|no|don't|avoid|damages?)\b/i

const pages = PAGES.map(readPage)
const page = (path: string) => pages.find(p => p.path === path)!

// ---------- handbook pages ----------

describe('handbook pages', () => {
  it('all exist', () => {
    for (const path of PAGES) expect(existsSync(join(HANDBOOK, path)), path).toBe(true)
  })

  it.each(PAGES)('%s has title, description, numeric order and a list of sources', (path) => {
    const { data } = page(path)
    expect(typeof data.title === 'string' && data.title.length > 0, 'title').toBe(true)
    expect(typeof data.description === 'string' && data.description.length > 0, 'description').toBe(true)
    expect(typeof data.order, 'order').toBe('number')
    expect(Array.isArray(data.sources), 'sources').toBe(true)
    expect((data.sources as string[]).length).toBeGreaterThan(0)
  })

  it.each(PAGES)('%s cites inline exactly the sources its front matter lists', (path) => {
    const { data, body } = page(path)
    const listed = new Set(data.sources as string[])
    const cited = new Set(inlineSources(body))
    expect(cited.size, 'at least one inline source').toBeGreaterThan(0)
    expect([...cited].filter(s => !listed.has(s)), 'cited but not listed').toEqual([])
    expect([...listed].filter(s => !cited.has(s)), 'listed but not cited').toEqual([])
    for (const s of listed) expect(KNOWN_SOURCES, `unknown source "${s}"`).toContain(s)
  })

  it('page orders are unique', () => {
    const orders = pages.map(p => p.data.order)
    expect(new Set(orders).size).toBe(orders.length)
  })

  it('the index links to every other page', () => {
    const index = page('index.md').body
    for (const path of PAGES.filter(p => p !== 'index.md')) {
      expect(index, path).toContain(`(/handbook/${path.replace(/\.md$/, '')})`)
    }
  })

  it('no page recommends a hot-needle or chemical test; any mention warns against it', () => {
    const all = listMarkdown(HANDBOOK)
    expect(all.length).toBeGreaterThanOrEqual(PAGES.length)
    for (const path of all) {
      const raw = readFileSync(join(HANDBOOK, path), 'utf8')
      for (const sentence of sentencesOf(raw)) {
        if (HOT_NEEDLE.test(sentence) || CHEMICAL_TEST.test(sentence)) {
          expect(sentence, `${path}: ${sentence}`).toMatch(WARNS)
        }
      }
    }
  })

  it('reading-a-base covers every mark type and hiding place', () => {
    const text = norm(page('reading-a-base.md').body).toLowerCase()
    // Mark types and places to look: common practice, no published source.
    for (const term of ['printed', 'stamped', 'impressed', 'incised', 'underglaze', 'painted signature',
      'moulded', 'paper label', 'foil label', 'under rims', 'inside lids', 'foot ring', 'under felt']) {
      expect(text, term).toContain(term)
    }
    // US Tariff Act of 1 Oct 1890 (McKinley Tariff), s.6: English country-of-origin marking from 1 Mar 1891;
    // absence of a mark proves nothing.
    const tariff = sentencesOf(page('reading-a-base.md').body).find(s => s.includes('McKinley Tariff'))
    expect(tariff).toMatch(/1 Mar 1891/)
    expect(text).toMatch(/no mark proves nothing/)
  })

  it('condition-and-grading names the condition words and the default grade scale', () => {
    const { body } = page('condition-and-grading.md')
    const text = norm(body).toLowerCase()
    // Condition words: common practice, no published source.
    for (const term of ['chip', 'crack', 'hairline', 'crazing', 'worn gilding', 'repair', 'missing part', 'stain']) {
      expect(text, term).toContain(term)
    }
    // Default grade scale, best to worst: common practice, no published source.
    const grades = tableRows(body).map(r => r[0]!.toLowerCase()).filter(g => g !== 'grade')
    expect(grades).toEqual(['new', 'excellent', 'very good', 'good', 'fair', 'poor'])
    // Damage by material (trade-facts 6, common practice): chipped resin passed over, carved wood still worth it.
    expect(text).toMatch(/chipped (cast-)?resin piece is usually passed over/)
    expect(text).toMatch(/carved wooden piece can still be worth buying/)
    // Adhesive tape can lift worn gilding (trade-facts 6, common practice).
    expect(text).toMatch(/tape[^.]*can lift worn gilding/)
  })
})

describe('handbook facts against their sources', () => {
  it('glass: uranium glass glows under UV-A 320–400 nm, 365 nm torches, with the manganese caveat', () => {
    const s = sentencesOf(page('materials/glass.md').body)
    // UV-A band 320–400 nm; 365 nm torches usual (trade-facts 2, H; common practice, no published source).
    expect(s.some(x => x.includes('320–400 nm') && /UV-A/.test(x))).toBe(true)
    expect(s.some(x => x.includes('365 nm'))).toBe(true)
    // Manganese glass can also glow under 365 nm: the colour of the glow matters (trade-facts 2, H).
    expect(s.some(x => /manganese/i.test(x) && x.includes('365 nm'))).toBe(true)
    expect(s.some(x => /manganese/i.test(x) && /colou?r/i.test(x))).toBe(true)
    // Uranium content trace to 2 % (trade-facts 2, H).
    expect(s.some(x => /uranium content/i.test(x) && /2 ?%/.test(x))).toBe(true)
    // Milk glass: 19th-century makers called it opal glass (trade-facts 2, M–H).
    expect(s.some(x => /opal glass/i.test(x))).toBe(true)
  })

  it('ceramics: firing temperatures and water absorption per body', () => {
    // The list item that describes each body, e.g. "- **Porcelain** is fired at ...".
    const items = unitsOf(page('materials/ceramics.md').body)
    const about = (body: string, re: RegExp) => items.some(x => x.startsWith(`- **${body}**`) && re.test(x))
    // Earthenware about 1000–1200 °C, absorption above about 5 % (trade-facts 2, approximate).
    expect(about('Earthenware', /1000–1200 ?°C/)).toBe(true)
    expect(about('Earthenware', /(above|over|more than|>) (about )?5 ?%/)).toBe(true)
    // Stoneware about 1100–1300 °C, absorption at most about 3 % (trade-facts 2, approximate).
    expect(about('Stoneware', /1100–1300 ?°C/)).toBe(true)
    expect(about('Stoneware', /(at most|≤|up to) (about )?3 ?%/)).toBe(true)
    // Porcelain about 1200–1400 °C, absorption under 0.5 %, translucent when thin, rings (trade-facts 2).
    expect(about('Porcelain', /1200–1400 ?°C/)).toBe(true)
    expect(about('Porcelain', /(under|below|less than|<) (about )?0\.5 ?%/)).toBe(true)
    expect(about('Porcelain', /translucent/)).toBe(true)
    expect(about('Porcelain', /rings/)).toBe(true)
  })

  it('ceramics: ASTM C373 absorption classes', () => {
    const { body } = page('materials/ceramics.md')
    expect(body).toContain('ASTM C373')
    const classes = Object.fromEntries(tableRows(body).map(r => [r[0]!.toLowerCase(), r[1]]))
    // ASTM C373 tile classes: impervious ≤ 0.5 %, vitreous 0.5–3 %, semi-vitreous 3–7 %, non-vitreous > 7 %.
    expect(classes['impervious']).toMatch(/^≤ ?0\.5 ?%$/)
    expect(classes['vitreous']).toMatch(/^0\.5–3 ?%$/)
    expect(classes['semi-vitreous']).toMatch(/^3–7 ?%$/)
    expect(classes['non-vitreous']).toMatch(/^> ?7 ?%$/)
  })

  it('ceramics: bone china 30 % (BS 5416, from memory) and 35 % (IS 6988:2002)', () => {
    const s = sentencesOf(page('materials/ceramics.md').body)
    // Bone china: at least 30 % phosphate from animal bone (BS 5416, memory).
    const bs = s.find(x => x.includes('BS 5416'))
    expect(bs).toMatch(/30 ?%/)
    expect(bs).toMatch(/from memory/)
    // India's IS 6988:2002: at least 35 % bone ash.
    const is = s.find(x => x.includes('IS 6988:2002'))
    expect(is).toMatch(/35 ?%/)
  })

  it('resin and wood: densities, with the Wood Handbook named for wood', () => {
    const s = sentencesOf(page('materials/resin-and-wood.md').body)
    // Cast resin about 1.1–1.5 g/cm³ (trade-facts 2, memory).
    const resin = s.find(x => x.includes('1.1–1.5 g/cm³'))
    expect(resin).toMatch(/resin/i)
    expect(resin).toMatch(/from memory/)
    // Most woods about 0.3–0.9 g/cm³ (USDA Forest Products Laboratory Wood Handbook).
    const wood = s.find(x => x.includes('0.3–0.9 g/cm³'))
    expect(wood).toMatch(/wood/i)
    expect(wood).toContain('Wood Handbook')
    // Seams, grain instead of a repeating pattern, same colour inside a chip (trade-facts 2).
    const text = norm(page('materials/resin-and-wood.md').body).toLowerCase()
    for (const term of ['seam', 'grain', 'same colour', 'warm']) expect(text, term).toContain(term)
  })

  it('chalkware: plaster or gypsum, water damages it, chips to white', () => {
    const text = norm(page('materials/chalkware.md').body).toLowerCase()
    // Trade-facts 2, H: moulded, painted plaster of Paris or gypsum; water damages it; it chips to white.
    expect(text).toContain('plaster of paris')
    expect(text).toContain('gypsum')
    expect(text).toMatch(/water damages/)
    expect(text).toMatch(/chips? show (bright )?white/)
  })

  it('plastic and metal: only non-destructive checks, chemical tests explained as damaging', () => {
    const text = norm(page('materials/plastic-and-metal.md').body).toLowerCase()
    // Simple checks (common practice): weight, magnet for ferrous metal, seams, temperature.
    for (const term of ['weight', 'magnet', 'ferrous', 'seam', 'temperature']) expect(text, term).toContain(term)
    // Chemical tests damage items and can release fumes (trade-facts 3, common practice).
    expect(text).toMatch(/chemical tests damage items/)
  })

  it('safety: FDA lead and cadmium leach limits, in µg/mL', () => {
    const { body } = page('safety.md')
    expect(body).toMatch(/[µμ]g\/mL/)
    const rows = Object.fromEntries(tableRows(body).map(r => [r[0]!.toLowerCase(), r.slice(1)]))
    // FDA leach limits, lead (µg/mL): flatware 3.0, small hollowware 2.0, large hollowware 1.0, cups/mugs/pitchers 0.5.
    // FDA leach limits, cadmium (µg/mL): flatware 0.5, small hollowware 0.5, large hollowware 0.25.
    expect(rows['flatware']).toEqual(['3.0', '0.5'])
    expect(rows['small hollowware']).toEqual(['2.0', '0.5'])
    expect(rows['large hollowware']).toEqual(['1.0', '0.25'])
    expect(rows['cups, mugs, pitchers']?.[0]).toBe('0.5')
  })

  it('safety: names 21 CFR 109.16 and the Nov 2010 FDA guidance, and defers to local rules and laboratories', () => {
    const { body, data } = page('safety.md')
    const text = norm(body)
    // 21 CFR 109.16: decorative ceramicware not for food use must say so, or have a hole through it.
    expect(text).toContain('(source: 21 CFR 109.16)')
    expect(sentencesOf(body).find(x => x.includes('21 CFR 109.16'))).toMatch(/hole/)
    // US FDA guidance (Nov 2010) on imported traditional pottery.
    expect(data.sources).toContain('US FDA guidance on imported traditional pottery, Nov 2010')
    // Trade-facts 3: suggested wording, and always defer to local rules and laboratory testing.
    expect(text).toMatch(/may leach lead or cadmium/)
    expect(text).toMatch(/local rules/i)
    expect(text).toMatch(/laborator/i)
    // Trade-facts 3: uranium glass: do not grind, drill or use damaged pieces for food.
    expect(text).toMatch(/Do not grind it, drill it/)
  })
})

// ---------- starter materials ----------

describe('STARTER_MATERIALS', () => {
  it('holds exactly the eleven starter materials', () => {
    expect(STARTER_MATERIALS.map(m => m.name).sort()).toEqual([
      'Bone china', 'Chalkware', 'Earthenware', 'Metal', 'Milk glass', 'Plastic', 'Porcelain', 'Resin',
      'Stoneware', 'Uranium glass', 'Wood',
    ].sort())
  })

  it('keys are unique kebab-case, tags are kebab-case', () => {
    const keys = STARTER_MATERIALS.map(m => m.key)
    expect(new Set(keys).size).toBe(keys.length)
    for (const m of STARTER_MATERIALS) {
      expect(m.key).toMatch(/^[a-z0-9]+(-[a-z0-9]+)*$/)
      expect(m.key).toBe(m.name.toLowerCase().replace(/\s+/g, '-'))
      expect(m.tags.length, m.key).toBeGreaterThan(0)
      for (const t of m.tags) expect(t).toMatch(/^[a-z0-9]+(-[a-z0-9]+)*$/)
    }
  })

  it.each(STARTER_MATERIALS.map(m => [m.key, m] as const))('%s has every field and six checks', (_key, m) => {
    for (const field of ['name', 'recognition', 'damage', 'notes', 'handbookPath'] as const) {
      expect(m[field].trim().length, field).toBeGreaterThan(0)
    }
    expect(typeof m.cautions).toBe('string')
    expect(Object.keys(m.checks).sort()).toEqual(['seams', 'sound', 'touch', 'translucency', 'uvGlow', 'weight'])
    for (const v of Object.values(m.checks)) expect(typeof v).toBe('string')
  })

  it.each(STARTER_MATERIALS.map(m => [m.key, m] as const))('%s has known sources, all cited inline', (_key, m) => {
    expect(m.sources.length).toBeGreaterThan(0)
    for (const s of m.sources) expect(KNOWN_SOURCES, `unknown source "${s}"`).toContain(s)
    const cited = new Set(inlineSources(materialText(m)))
    expect([...cited].filter(s => !m.sources.includes(s)), 'cited but not listed').toEqual([])
    expect(m.sources.filter(s => !cited.has(s)), 'listed but not cited').toEqual([])
  })

  it.each(STARTER_MATERIALS.map(m => [m.key, m] as const))('%s links to an existing handbook page', (_key, m) => {
    expect(m.handbookPath).toMatch(/^\/handbook\/[a-z0-9/-]+$/)
    const rel = m.handbookPath.replace(/^\//, '')
    const file = join(ROOT, 'content', `${rel}.md`)
    const index = join(ROOT, 'content', rel, 'index.md')
    expect(existsSync(file) || existsSync(index), m.handbookPath).toBe(true)
  })

  it('every caution defers to local rules and laboratory testing', () => {
    for (const m of STARTER_MATERIALS.filter(m => m.cautions.trim() !== '')) {
      expect(m.cautions, m.key).toMatch(/local rules/i)
      expect(m.cautions, m.key).toMatch(/laborator/i)
    }
  })

  it('no material recommends a hot-needle or chemical test', () => {
    for (const m of STARTER_MATERIALS) {
      for (const sentence of sentencesOf(materialText(m))) {
        if (HOT_NEEDLE.test(sentence) || CHEMICAL_TEST.test(sentence)) {
          expect(sentence, m.key).toMatch(WARNS)
        }
      }
    }
  })

  it('glazed ceramics carry the lead and cadmium caution (FDA Nov 2010; 21 CFR 109.16)', () => {
    for (const key of ['earthenware', 'stoneware', 'porcelain', 'bone-china']) {
      const { cautions, sources } = material(key)
      expect(cautions, key).toMatch(/lead/)
      expect(cautions, key).toMatch(/cadmium/)
      expect(sources, key).toContain('21 CFR 109.16')
      expect(sources, key).toContain('US FDA guidance on imported traditional pottery, Nov 2010')
    }
  })

  it('uranium glass: 320–400 nm, 365 nm and the manganese caveat', () => {
    const u = material('uranium-glass')
    const text = norm(materialText(u))
    // UV-A 320–400 nm; 365 nm torches usual (trade-facts 2, H).
    expect(text).toContain('320–400 nm')
    expect(norm(u.checks.uvGlow)).toContain('365 nm')
    // Manganese glass can also glow under 365 nm (trade-facts 2, H).
    expect(u.checks.uvGlow).toMatch(/manganese/i)
    expect(u.recognition).toMatch(/manganese/i)
    // Low radioactivity: do not grind, drill or use damaged pieces for food (trade-facts 3).
    expect(u.cautions).toMatch(/grind/)
    expect(u.cautions).toMatch(/drill/)
  })

  it('ceramic bodies: absorption and ASTM C373 classes', () => {
    // Porcelain absorption under 0.5 %; ASTM C373 impervious ≤ 0.5 %.
    const porcelain = material('porcelain')
    expect(norm(porcelain.recognition)).toMatch(/(under|below|less than|<) (about )?0\.5 ?%/)
    expect(porcelain.recognition).toMatch(/impervious/)
    expect(porcelain.sources).toContain('ASTM C373')
    // Stoneware absorption at most about 3 %; ASTM C373 vitreous 0.5–3 %.
    const stoneware = material('stoneware')
    expect(norm(stoneware.recognition)).toMatch(/(at most|≤|up to) (about )?3 ?%/)
    expect(stoneware.sources).toContain('ASTM C373')
    // Earthenware absorption above about 5 %, porous.
    const earthenware = material('earthenware')
    expect(norm(earthenware.recognition)).toMatch(/(above|over|more than|>) (about )?5 ?%/)
    expect(earthenware.recognition).toMatch(/porous/)
    // Porcelain translucent when thin, rings when tapped (trade-facts 2).
    expect(porcelain.checks.translucency).not.toBe('')
    expect(porcelain.checks.sound).toMatch(/ring/)
  })

  it('bone china: 30 % (BS 5416, from memory) and 35 % (IS 6988:2002)', () => {
    const b = material('bone-china')
    const s = sentencesOf(b.recognition)
    // At least 30 % phosphate from animal bone: British Standard BS 5416 (memory).
    expect(s.find(x => x.includes('BS 5416'))).toMatch(/30 ?%/)
    expect(b.sources).toContain('British Standard BS 5416, from memory')
    // At least 35 % bone ash: India's IS 6988:2002.
    expect(s.find(x => x.includes('IS 6988:2002'))).toMatch(/35 ?%/)
    expect(b.sources).toContain('Indian Standard IS 6988:2002')
  })

  it('resin 1.1–1.5 g/cm³ (memory) vs wood 0.3–0.9 g/cm³ (Wood Handbook)', () => {
    const resin = material('resin')
    const wood = material('wood')
    // Cast resin about 1.1–1.5 g/cm³ (trade-facts 2, memory).
    expect(norm(resin.recognition)).toContain('1.1–1.5 g/cm³')
    expect(resin.sources).toContain('from memory')
    // Most woods about 0.3–0.9 g/cm³ (USDA Forest Products Laboratory Wood Handbook).
    expect(norm(wood.recognition)).toContain('0.3–0.9 g/cm³')
    expect(wood.sources).toContain('USDA Forest Products Laboratory Wood Handbook')
    // Both feel warm (trade-facts 2).
    expect(resin.checks.touch).toMatch(/warm/i)
    expect(wood.checks.touch).toMatch(/warm/i)
    // A chipped resin piece is usually passed over; carved wood can still be worth buying (trade-facts 6).
    expect(resin.damage).toMatch(/passed over/)
    expect(wood.damage).toMatch(/still be worth buying/)
  })

  it('metal: a magnet for ferrous metal; plastic and metal warn against chemical tests', () => {
    // Magnet sticks to ferrous metal (common practice, no published source).
    expect(material('metal').recognition).toMatch(/magnet[^.]*ferrous/)
    // Chemical tests damage items (trade-facts 3, common practice).
    expect(material('plastic').cautions).toMatch(/chemical tests/)
    expect(material('metal').cautions).toMatch(/chemical tests/)
  })

  it('chalkware, milk glass: trade-facts section 2', () => {
    // Chalkware: plaster of Paris or gypsum; water damages it; chips to white (H).
    const c = material('chalkware')
    expect(c.recognition).toMatch(/plaster of Paris or gypsum/)
    expect(c.damage).toMatch(/[Ww]ater damages/)
    expect(c.damage).toMatch(/chips to white/)
    // Milk glass: opaque or translucent, white or coloured; once called opal glass (M–H).
    const mg = material('milk-glass')
    expect(mg.recognition).toMatch(/[Oo]paque or translucent/)
    expect(mg.recognition).toMatch(/opal glass/)
  })
})
