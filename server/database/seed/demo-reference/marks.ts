// Builds the demo marks deterministically from small tables: 2–5 marks per invented maker from
// wording templates, the look-alike pairs' marks, and marks whose maker the team does not know.
// Each template states the years its wording allows (the same clues shared/dating reads), and a
// mark's years are drawn inside that window, the maker's years and its country's years.
import type { DemoDateConfidence, DemoMark, DemoMarkType, DemoMaterialKey } from './types'
import { LINES, MAKER_ROWS, slug } from './makers'
import type { MakerRow, ProductLine } from './makers'
import { LOOKALIKE_SPECS, copyKey, signatureKey } from './lookalikes'
import type { LookalikeSpec } from './lookalikes'

export type Rand = () => number

/** mulberry32: a tiny seeded generator, so the demo data is the same on every machine. */
export function mulberry32(seed: number): Rand {
  let a = seed >>> 0
  return () => {
    a = (a + 0x6D2B79F5) >>> 0
    let t = a
    t = Math.imul(t ^ (t >>> 15), t | 1)
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61)
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296
  }
}

/** FNV-1a, so each maker gets its own stream and adding a maker does not reshuffle the others. */
function hash(text: string): number {
  let h = 0x811C9DC5
  for (const ch of text) h = Math.imul(h ^ ch.codePointAt(0)!, 0x01000193) >>> 0
  return h
}

const SEED = 20260117
const LAST_YEAR = 2024

const pick = <T>(r: Rand, list: readonly T[]): T => list[Math.floor(r() * list.length)]!
const int = (r: Rand, lo: number, hi: number) => lo + Math.floor(r() * (hi - lo + 1))

function shuffle<T>(r: Rand, list: readonly T[]): T[] {
  const out = [...list]
  for (let i = out.length - 1; i > 0; i--) {
    const j = Math.floor(r() * (i + 1))
    ;[out[i], out[j]] = [out[j]!, out[i]!]
  }
  return out
}

const PATTERNS = [
  'Prairie Aster', 'Lantern Bay', 'Copper Fern', 'Thimbleberry', 'Silver Birch', 'Orchard Bloom', 'Wren Song',
  'Quilt Garden', 'Morning Dew', 'Tansy', 'Kestrel', 'Juniper Lane', 'Foxglove Path', 'Larkspur', 'Heather Hill',
  'Cobblestone', 'Salt Marsh', 'Gingham Hen', 'Dovetail', 'Woodsmoke', 'Lilac Lane', 'Amberfield', 'Starling',
  'Misty Pine', 'Sandpiper', 'Clover Patch', 'Goldcrest', 'Willowmere', 'Fiddlehead', 'Sorrel', 'Bramble Hedge',
]

const INK = ['black', 'blue', 'green', 'brown', 'maroon', 'gold', 'red']
const COLOURS: Record<DemoMarkType, string[]> = {
  printed: INK, underglaze: ['blue', 'green', 'black', 'brown'], painted: ['red', 'black', 'gold', 'blue'],
  impressed: ['none (in the clay)'], incised: ['none (scratched in)'], moulded: ['none (in the mould)'],
  paper_label: ['red and gold', 'black on silver', 'green and white', 'blue and white'], foil_label: ['gold', 'silver', 'gold and black'],
  other: ['none', 'etched', 'embossed'],
}

function fold(text: string): string {
  return text.normalize('NFD').replace(/\p{M}/gu, '').replace(/ß/g, 'ss')
}

const ACRONYMS = new Set(['USSR', 'CCCP', 'KG', 'ZFZ'])

function titleCase(text: string): string {
  return text.replace(/\p{L}+/gu, word => (word.length <= 1 || ACRONYMS.has(word) ? word : word[0]!.toUpperCase() + word.slice(1).toLowerCase()))
}

const ABBREVIATIONS: [RegExp, string][] = [
  [/\bPottery\b/g, 'Pott.'], [/\bCompany\b/g, 'Co.'], [/\bPorcelain\b/g, 'Porc.'], [/\bLimited\b/g, 'Ltd.'],
  [/\bManufacturing\b/g, 'Mfg.'], [/^Made In /, ''], [/\bCeramics\b/g, 'Cer.'],
]

/** The ways the team has typed a mark off a base: full, worn at the start, letters dropped, recased. */
export function inscriptionVariants(r: Rand, full: string): string[] {
  const letters = full.replace(/[^\p{L}]/gu, '')
  const cut = Math.max(2, Math.floor(full.length * (0.25 + 0.25 * r())))
  const worn = `...${full.slice(cut).trimStart()}`
  const words = full.split(' ')
  const candidates = words.map((w, i) => [w, i] as const).filter(([w]) => /^\p{L}{5,}$/u.test(w))
  let dropped = ''
  if (candidates.length) {
    const [word, index] = pick(r, candidates)
    const at = int(r, 1, word.length - 2)
    dropped = words.map((w, i) => (i === index ? `${w.slice(0, at)} ${w.slice(at + 1)}` : w)).join(' ')
  }
  let recased = letters === letters.toUpperCase() ? titleCase(full) : full.toUpperCase()
  for (const [pattern, short] of ABBREVIATIONS) recased = recased.replace(pattern, short)
  recased = fold(recased)
  const extras = shuffle(r, [worn, dropped, recased]).slice(0, int(r, 1, 3))
  const out = [full]
  for (const variant of [...extras, recased, worn]) {
    if (variant && variant.trim() !== '...' && !out.includes(variant) && (out.length < 2 || extras.includes(variant))) out.push(variant)
  }
  return out.slice(0, 4)
}

// ---------- wording: countries, states, templates ----------

/** Inclusive years a wording allows; null = open. */
type Window = [number | null, number | null]

interface Ctx { r: Rand, stamp: string, name: string, town: string, state: string, country: string, pattern: string, from: number }

interface CountryWords { window: Window, made: string, madeWindow?: Window, short: string, label: string, hint: string }

const ONLY_1891 = 'A country name only says 1891 or later.'
const COUNTRIES: Record<string, CountryWords> = {
  'United States': { window: [null, null], made: 'MADE IN U.S.A.', short: 'U.S.A.', label: 'Made in U.S.A.', hint: 'U.S.A. alone gives no date.' },
  'England': { window: [1891, null], made: 'MADE IN ENGLAND', madeWindow: [1921, null], short: 'ENGLAND', label: 'Made in England', hint: 'Made in England: mostly 1921 or later, a rule of thumb only.' },
  'Japan': { window: [1921, null], made: 'MADE IN JAPAN', short: 'JAPAN', label: 'Made in Japan', hint: 'Japan: 1921 or later, and not 1942–1947.' },
  'West Germany': { window: [1949, 1990], made: 'MADE IN WEST GERMANY', short: 'W. GERMANY', label: 'Made in W. Germany', hint: 'W. Germany dates it 1949–1990.' },
  'Czechoslovakia': { window: [1918, 1992], made: 'MADE IN CZECHOSLOVAKIA', short: 'CZECHO-SLOVAKIA', label: 'Made in Czechoslovakia', hint: 'Czechoslovakia: 1918–1992, and not the war years.' },
  'Italy': { window: [1891, null], made: 'MADE IN ITALY', short: 'ITALY', label: 'Made in Italy', hint: ONLY_1891 },
  'China': { window: [1971, null], made: 'MADE IN CHINA', short: 'P.R.C.', label: 'Made in China', hint: 'China on the base: 1971 or later for the US market.' },
  'Mexico': { window: [1891, null], made: 'HECHO EN MEXICO', short: 'MEXICO', label: 'Hecho en México', hint: ONLY_1891 },
  'Sweden': { window: [1891, null], made: 'MADE IN SWEDEN', short: 'SWEDEN', label: 'Made in Sweden', hint: ONLY_1891 },
  'USSR': { window: [1922, 1991], made: 'MADE IN USSR', short: 'U.S.S.R.', label: 'Made in USSR', hint: 'USSR: 1922–1991.' },
  'Yugoslavia': { window: [1929, 2003], made: 'MADE IN YUGOSLAVIA', short: 'JUGOSLAVIJA', label: 'Made in Yugoslavia', hint: 'Yugoslavia: 1929–2003, mostly 1945–1991.' },
}

/** Code → [name, pre-1963 abbreviation, first two ZIP digits]. */
const STATES: Record<string, [string, string, string]> = {
  OH: ['Ohio', 'Ohio', '44'], IL: ['Illinois', 'Ill.', '61'], PA: ['Pennsylvania', 'Pa.', '16'], MN: ['Minnesota', 'Minn.', '56'],
  WV: ['West Virginia', 'W. Va.', '25'], CA: ['California', 'Calif.', '93'], IN: ['Indiana', 'Ind.', '47'], MO: ['Missouri', 'Mo.', '64'],
  MA: ['Massachusetts', 'Mass.', '01'], NY: ['New York', 'N.Y.', '13'], TN: ['Tennessee', 'Tenn.', '38'], WI: ['Wisconsin', 'Wis.', '54'],
  NE: ['Nebraska', 'Nebr.', '68'],
}

const k = (c: Ctx) => COUNTRIES[c.country]!
const upper = (text: string) => text.toUpperCase()
const stateName = (c: Ctx) => STATES[c.state]![0]
const zip = (c: Ctx) => `${STATES[c.state]![2]}${int(c.r, 100, 999)}`
const num = (c: Ctx) => int(c.r, 100, 999)

/** A 12-digit UPC-A with its check digit, grouped as printed under the bars. */
export function upc(r: Rand, first = ''): string {
  const digits = (first + Array.from({ length: 11 }, () => int(r, 0, 9)).join('')).slice(0, 11).split('').map(Number)
  const sum = digits.reduce((total, d, i) => total + (i % 2 === 0 ? 3 * d : d), 0)
  const all = [...digits, (10 - (sum % 10)) % 10].join('')
  return `${all[0]} ${all.slice(1, 6)} ${all.slice(6, 11)} ${all[11]}`
}

interface Template {
  id: string
  label: string
  window: Window
  types: DemoMarkType[]
  confidence: DemoDateConfidence
  text: (c: Ctx) => string
  hint: (c: Ctx) => string
  /** true: US makers only; false: makers elsewhere only. */
  us?: boolean
  lines?: ProductLine[]
  fits?: (row: MakerRow) => boolean
  openEnded?: boolean
  /** The wording uses the country's "Made in" form, which may narrow the years ("Made in England"). */
  made?: boolean
}

type Extra = Pick<Template, 'us' | 'lines' | 'fits' | 'made'>
function t(id: string, label: string, window: Window, types: DemoMarkType[], confidence: DemoDateConfidence, text: Template['text'], hint: string | Template['hint'], extra: Extra): Template {
  return { id, label, window, types, confidence, text, hint: typeof hint === 'string' ? () => hint : hint, ...extra }
}

const US: Extra = { us: true }
const ABROAD: Extra = { us: false }
const MADE: Extra = { us: false, made: true }
const NEVER = () => false
const inCountry = (...countries: string[]) => (row: MakerRow) => countries.includes(row.country)
const KITCHEN: ProductLine[] = ['dinnerware', 'mugs', 'bakeware', 'kitchen']
const INITIALS = 'BCDFGHJKLMPRSTVW'

const TEMPLATES: Template[] = [
  t('signature-us', 'signature mark', [null, null], ['printed'], 'medium', c => `${c.stamp} "${upper(c.pattern)}" U.S.A.`, '', { ...US, fits: NEVER }),
  t('usa-shape', 'U.S.A. and shape number', [null, null], ['impressed', 'moulded'], 'low', c => `${c.stamp} U.S.A. ${num(c)}`, 'U.S.A. and a shape number give no date; the number helps match lids and pairs.', { ...US, lines: ['art-pottery', 'kitchen', 'bakeware', 'milk-glass', 'uranium-glass', 'dolls', 'mugs', 'figurines', 'chalkware'] }),
  t('town-state', 'town-and-state mark', [1895, 1962], ['printed', 'impressed', 'underglaze'], 'low', c => `${c.stamp} ${upper(c.town)}, ${upper(stateName(c))}`, 'The state written out with no zone or ZIP hints at before 1963, no more.', US),
  t('postal-zone', 'postal-zone mark', [1943, 1963], ['printed', 'underglaze', 'paper_label'], 'high', c => `${c.stamp} ${c.town} ${int(c.r, 2, 28)}, ${pick(c.r, STATES[c.state]!.slice(0, 2))}`, 'The zone number after the town puts it between 1943 and 1963.', US),
  t('state-zip', 'ZIP-code mark', [1963, null], ['printed', 'paper_label', 'impressed'], 'high', c => `${c.stamp} ${upper(c.town)}, ${c.state} ${zip(c)}`, 'A two-letter state code and a ZIP code: 1963 or later.', { ...US, fits: row => !row.place.endsWith('NE') }),
  t('state-zip-ne', 'NE ZIP-code mark', [1969, null], ['printed', 'paper_label', 'impressed'], 'high', c => `${c.stamp} ${upper(c.town)}, NE ${zip(c)}`, 'NE for Nebraska means 1969 or later.', { ...US, fits: row => row.place.endsWith('NE') }),
  t('state-nb', 'early NB label', [1963, 1969], ['paper_label', 'printed'], 'high', c => `${c.stamp} ${upper(c.town)}, NB ${zip(c)}`, 'NB was Nebraska\'s code only from 1963 to 1969: an early piece.', { ...US, fits: row => row.place.endsWith('NE') }),
  t('zip4', 'ZIP+4 label', [1983, null], ['paper_label', 'printed'], 'high', c => `${c.name} ${c.town}, ${c.state} ${zip(c)}-${int(c.r, 1000, 9999)}`, 'A ZIP+4 code means 1983 or later.', US),
  t('state-usa', 'state-code mark', [1963, null], ['impressed', 'moulded', 'printed'], 'high', c => `${c.stamp} ${upper(c.town)}, ${c.state} U.S.A.`, 'A two-letter state code after the town: 1963 or later.', { ...US, fits: row => !row.place.endsWith('NE') }),
  t('reg-pat-off', '"{P}" Reg. U.S. Pat. Off. mark', [1905, null], ['printed', 'underglaze', 'paper_label'], 'medium', c => `"${upper(c.pattern)}" BY ${c.stamp} REG. U.S. PAT. OFF.`, 'Reg. U.S. Pat. Off. means 1905 or later and sets no upper limit.', US),
  t('reg-tm-off', '"{P}" Pat. & Tm. Off. mark', [1975, null], ['printed', 'paper_label'], 'high', c => `${upper(c.pattern)}® ${c.stamp} REG. U.S. PAT. & TM. OFF.`, 'Pat. & Tm. Off. only appears from 1975.', US),
  t('registered', '® mark', [1947, null], ['printed', 'underglaze', 'moulded', 'paper_label'], 'medium', c => `${c.stamp}® ${upper(c.pattern)} U.S.A.`, 'The ® sign means 1947 or later on US goods.', US),
  t('oven-proof', 'oven-proof mark', [1925, null], ['impressed', 'printed'], 'low', c => `${c.stamp} OVEN PROOF U.S.A.`, '"Oven proof" wording is from about the 1920s on.', { ...US, lines: ['bakeware', 'kitchen', 'dinnerware', 'metalware'] }),
  t('dishwasher', '"{P}" dishwasher-safe mark', [1955, null], ['printed', 'underglaze'], 'low', c => `${upper(c.pattern)} ${c.stamp} DISHWASHER SAFE`, 'Dishwasher wording: 1950s or later.', { ...US, lines: KITCHEN }),
  t('microwave', 'microwave-safe mark', [1978, null], ['printed', 'underglaze', 'impressed'], 'medium', c => `${c.stamp} ${upper(c.town)}, ${c.state} MICROWAVE & DISHWASHER SAFE`, 'Microwave wording: late 1970s or later.', { ...US, lines: [...KITCHEN, 'metalware'] }),
  t('upc', 'barcode label', [1976, null], ['paper_label'], 'high', c => `${c.name} ${c.pattern} ${upc(c.r, '0')}`, 'A UPC barcode on the label: 1973 or later.', { ...US, lines: ['resin', 'games', 'candles', 'dolls', 'metalware', 'mugs', 'kitchen', 'tin-toys'] }),
  t('copyright', '© year mark', [1950, null], ['printed', 'moulded'], 'low', c => `© ${c.from} ${c.stamp} ${upper(c.town)}, ${upper(stateName(c))}`, c => `The © ${c.from} is the design year: made then or later.`, { ...US, lines: ['resin', 'games', 'dolls', 'tin-toys', 'chalkware', 'candles'] }),
  t('hand-signed', 'hand-signed mark', [null, null], ['incised', 'painted'], 'low', c => `${c.name} hand made ${pick(c.r, [...INITIALS])}${pick(c.r, [...INITIALS])}`, 'No date in the mark; go by glaze, shape and the initials list in the handbook.', { ...US, lines: ['art-pottery', 'wood', 'mugs', 'figurines'] }),
  t('tin-litho', 'printed maker\'s mark', [null, null], ['printed', 'other'], 'low', c => `${c.stamp} ${upper(c.town)}, ${upper(stateName(c))} MADE IN U.S.A.`, 'Made in U.S.A. gives no date by itself.', { ...US, lines: ['tin-toys', 'games'] }),
  t('patent', 'patent-number mark', [1925, 1965], ['printed', 'impressed', 'other'], 'low', c => `${c.stamp} PAT. NO. ${int(c.r, 1, 2)},${int(c.r, 100, 999)},${int(c.r, 100, 999)}`, 'A patent number gives the earliest year, not the year made.', { ...US, lines: ['tin-toys', 'metalware', 'kitchen', 'games', 'candles'] }),
  t('signature', 'signature mark', [null, null], ['printed'], 'medium', c => `"${upper(c.pattern)}" ${c.stamp} ${k(c).short}`, '', { ...ABROAD, fits: NEVER }),
  t('made-in', '"Made in" mark', [null, null], ['printed', 'underglaze', 'impressed'], 'medium', c => `${c.stamp} ${k(c).made}`, c => k(c).hint, MADE),
  t('name-country', 'name-and-country mark', [null, null], ['impressed', 'printed', 'moulded'], 'low', c => `${c.stamp} ${k(c).short}`, c => k(c).hint, ABROAD),
  t('pattern-country', '"{P}" mark', [null, null], ['printed', 'underglaze'], 'low', c => `"${upper(c.pattern)}" ${c.stamp} ${k(c).short}`, c => k(c).hint, { ...ABROAD, lines: ['dinnerware', 'kitchen', 'mugs', 'bone-china', 'figurines', 'art-pottery'] }),
  t('label', 'paper label', [null, null], ['paper_label', 'foil_label'], 'low', c => `${c.name} ${k(c).label}`, c => `Photograph the label before it falls off. ${k(c).hint}`, MADE),
  t('shape-number', 'shape-number mark', [null, null], ['impressed', 'moulded'], 'low', c => `${k(c).short} ${num(c)}${c.country === 'West Germany' ? `-${int(c.r, 10, 45)}` : ''}`, c => `No maker's name, but the shape and the number match this maker. ${k(c).hint}`, { ...ABROAD, lines: ['art-pottery', 'figurines', 'milk-glass', 'pressed-glass', 'uranium-glass', 'dolls'] }),
  t('registered-abroad', '® label', [1947, null], ['printed', 'paper_label', 'foil_label'], 'medium', c => `${c.stamp}® ${k(c).made}`, 'The ® sign means 1947 or later.', MADE),
  t('occupied', 'Occupied Japan mark', [1947, 1952], ['printed', 'paper_label', 'impressed'], 'high', c => `${c.stamp} MADE IN OCCUPIED JAPAN`, 'Made in Occupied Japan: 1947–1952.', { ...ABROAD, fits: inCountry('Japan') }),
  t('hand-painted', 'hand-painted mark', [null, null], ['painted', 'printed'], 'low', c => `${c.stamp} HAND PAINTED ${k(c).made}`, c => k(c).hint, { ...MADE, lines: ['art-pottery', 'figurines', 'dinnerware', 'kitchen', 'mugs', 'decor', 'wood'], fits: inCountry('Japan', 'Italy', 'Mexico', 'Czechoslovakia', 'Yugoslavia') }),
  t('bone-china', 'bone china mark', [1921, null], ['printed', 'underglaze'], 'medium', c => `${c.stamp} FINE BONE CHINA MADE IN ENGLAND`, '"Bone china" is the material, not the country. Made in England: mostly 1921 or later.', { ...ABROAD, lines: ['bone-china'], fits: inCountry('England') }),
  t('england-town', 'town and ENGLAND mark', [1891, 1935], ['printed', 'impressed'], 'low', c => `${c.stamp} ${upper(c.town)} ENGLAND`, 'ENGLAND without "Made in" often means before about 1921, a rule of thumb only.', { ...ABROAD, fits: inCountry('England') }),
  t('microwave-abroad', '"{P}" microwave-safe mark', [1978, null], ['printed', 'underglaze'], 'medium', c => `${upper(c.pattern)} ${c.stamp} MICROWAVE SAFE ${k(c).made}`, 'Microwave wording: late 1970s or later.', { ...MADE, lines: KITCHEN }),
  t('ovenproof-abroad', 'ovenproof mark', [1925, null], ['impressed', 'printed'], 'low', c => `${c.stamp} OVENPROOF ${k(c).short}`, 'Ovenproof wording: about the 1920s or later.', { ...ABROAD, lines: ['bakeware', 'kitchen', 'dinnerware'] }),
  t('dishwasher-abroad', 'dishwasher-safe mark', [1955, null], ['printed'], 'low', c => `${c.stamp} ${k(c).made} DISHWASHER SAFE`, 'Dishwasher wording: 1950s or later.', { ...MADE, lines: ['dinnerware', 'mugs'] }),
  t('foreign', 'FOREIGN mark', [1921, 1938], ['printed', 'impressed', 'paper_label'], 'low', c => `${c.stamp} FOREIGN`, '"Foreign" was for the British market; on this maker it means the interwar years.', { ...ABROAD, fits: inCountry('Japan', 'Czechoslovakia') }),
  t('copyright-abroad', '© year mark', [1950, null], ['printed', 'moulded'], 'low', c => `© ${c.from} ${c.stamp} ${k(c).made}`, c => `The © ${c.from} is the design year: made then or later.`, { ...MADE, lines: ['resin', 'dolls', 'tin-toys'] }),
  t('upc-abroad', 'barcode label', [1976, null], ['paper_label'], 'high', c => `${c.name} ${k(c).label} ${upc(c.r, '7')}`, 'A UPC barcode on the label: 1973 or later.', { ...MADE, lines: ['resin', 'dolls', 'mugs', 'candles'] }),
  t('cyrillic', 'Cyrillic price mark', [null, null], ['printed', 'paper_label'], 'medium', c => `${c.stamp} СДЕЛАНО В СССР ЦЕНА ${int(c.r, 1, 9)} Р. ${int(c.r, 10, 90)} К.`, 'СССР is Cyrillic for USSR: 1922–1991. Soviet goods carried their price.', { ...ABROAD, fits: inCountry('USSR') }),
  t('cccp', 'CCCP mark', [null, null], ['printed', 'moulded', 'impressed'], 'medium', c => `${c.stamp} CCCP ${num(c)}`, '"CCCP" is the Cyrillic СССР read as Latin letters: 1922–1991.', { ...ABROAD, fits: inCountry('USSR') }),
]

function intersect(a: Window, b: Window): Window {
  const from = a[0] === null ? b[0] : b[0] === null ? a[0] : Math.max(a[0], b[0])
  const to = a[1] === null ? b[1] : b[1] === null ? a[1] : Math.min(a[1], b[1])
  return [from, to]
}

function windowOf(template: Template, country: string): Window {
  const words = COUNTRIES[country]!
  const made = template.made && words.madeWindow ? words.madeWindow : [null, null] as Window
  return intersect(intersect(template.window, words.window), made)
}

// ---------- marks whose maker the team does not know ----------

interface UnknownMark {
  key: string
  title: string
  inscriptions: string[]
  markType: DemoMarkType
  country: string
  years: Window
  confidence: DemoDateConfidence
  material: DemoMaterialKey
  category: string
  position: string
  notes: string
}

function u(key: string, title: string, inscriptions: string[], markType: DemoMarkType, country: string, years: Window, confidence: DemoDateConfidence, material: DemoMaterialKey, category: string, notes: string): UnknownMark {
  return { key, title, inscriptions, markType, country, years, confidence, material, category, position: 'base', notes }
}

const PRICE_STICKER = upc(mulberry32(7), '0')

const UNKNOWN_MARKS: UnknownMark[] = [
  u('japan', 'Plain JAPAN stamp', ['JAPAN', 'Japan', 'JAP N'], 'printed', 'Japan', [1950, 1980], 'low', 'porcelain', 'pottery-figurines', 'Just the country in red or black. Thousands of small workshops used it; price by the piece, not the mark.'),
  u('made-in-taiwan', '"Made in Taiwan" paper label', ['Made in Taiwan', 'MADE IN TAIWAN', 'ade in Taiw'], 'paper_label', 'Taiwan', [1965, 1995], 'low', 'earthenware', 'pottery-figurines', 'Gift-shop stock. Sells at $4–$8 unless it is a cute animal.'),
  u('number-24', 'Impressed number 24', ['24', '#24', '2 4'], 'impressed', '', [null, null], 'low', 'earthenware', 'pottery-planters', 'A shape number with no maker or country. **Proves nothing** about age; compare the shape with the planters in the handbook.'),
  u('number-412-usa', 'Impressed 412 USA', ['412 USA', '412 U.S.A.', '41_ USA'], 'impressed', 'United States', [1940, 1975], 'low', 'stoneware', 'pottery-vases', 'Several Ohio and Illinois potteries used plain USA and a number. Go by the glaze.'),
  u('occupied-japan', 'Made in Occupied Japan, no maker', ['MADE IN OCCUPIED JAPAN', 'Made in Occupied Japan', 'OCCUPIED JAPAN'], 'printed', 'Japan', [1947, 1952], 'high', 'porcelain', 'pottery-figurines', 'Collectors look for these: even small figurines sell at $12–$20. Check the mark is not a sticker added later.'),
  u('hong-kong', '"Made in Hong Kong" label', ['MADE IN HONG KONG', 'Made in Hong Kong', 'HONG KONG'], 'paper_label', 'Hong Kong', [1958, 1990], 'low', 'plastic', 'toys-dolls', 'Hong Kong gives no date on its own: it was still written after 1997.'),
  u('china-foil', '"Made in China" foil label', ['Made in China', 'MADE IN CHINA', 'ade in Chin'], 'foil_label', 'China', [1985, null], 'medium', 'resin', 'decor-resin', 'Modern. Fine as decor; we do not buy these to resell.'),
  u('w-germany-number', 'W. Germany and shape number', ['W. GERMANY 614-20', 'W.GERMANY 614', 'W. Germ 614-20'], 'impressed', 'West Germany', [1960, 1985], 'medium', 'stoneware', 'pottery-vases', 'Many West German potteries used a shape number with a size after the dash. Photograph the glaze for the buyer.'),
  u('czechoslovakia', 'Acid-etched Czechoslovakia', ['MADE IN CZECHOSLOVAKIA', 'CZECHOSLOVAKIA', 'MADE IN CZECHO'], 'other', 'Czechoslovakia', [1920, 1938], 'medium', 'uranium-glass', 'glass-uranium', 'Tiny etched letters under the foot: use the loupe. Check the glow with the torch.'),
  u('foreign', 'FOREIGN only', ['FOREIGN', 'FOREIGN 38', 'FOREI N'], 'impressed', '', [1900, 1939], 'low', 'porcelain', 'pottery-figurines', 'Marked for the British market, so it came here second-hand. Usually German or Japanese.'),
  u('microwave-dishwasher', 'Microwave and dishwasher safe, no maker', ['MICROWAVE SAFE DISHWASHER SAFE', 'Microwave & Dishwasher Safe', 'MICROWAVE SA'], 'printed', '', [1980, null], 'medium', 'stoneware', 'kitchen-mugs', 'Late. Buyers still use these, so clean and sell at $5–$8.'),
  u('oven-proof-usa', 'OVEN PROOF U.S.A., no maker', ['OVEN PROOF U.S.A.', 'OVENPROOF USA', 'OVEN PRO F USA'], 'impressed', 'United States', [1930, 1970], 'low', 'stoneware', 'kitchen-bakeware', 'Brown drip casseroles nobody claims. Lids sell them at about $14.'),
  u('italy-foil', '"Made in Italy" foil label', ['MADE IN ITALY', 'Italy', 'MADE IN ITA'], 'foil_label', 'Italy', [1955, 1985], 'low', 'earthenware', 'pottery-vases', 'Tall glossy vases sell to decorators at $20–$45 if the label survives.'),
  u('hecho-en-mexico', 'Painted Hecho en México', ['HECHO EN MEXICO', 'Hecho en México', 'HECHO EN MEX'], 'painted', 'Mexico', [1955, 1990], 'low', 'earthenware', 'pottery-planters', 'Tourist pottery; paint flakes with water, so dust it only.'),
  u('cccp', 'CCCP, no maker', ['CCCP', 'СДЕЛАНО В СССР', 'Made in USSR'], 'printed', 'USSR', [1960, 1988], 'medium', 'metal', 'toys-tin', 'Soviet tin toys sell well boxed. The Cyrillic line is "made in USSR".'),
  u('yugoslavia', '"Made in Yugoslavia" label', ['MADE IN YUGOSLAVIA', 'Yugoslavia', 'MADE IN YUGOSL'], 'paper_label', 'Yugoslavia', [1960, 1989], 'medium', 'milk-glass', 'glass-pressed', 'Pressed glass for export; bowls sell at $8–$15.'),
  u('korea', 'KOREA stamp', ['KOREA', 'Made in Korea', 'KORE'], 'printed', 'Korea', [1965, 1995], 'low', 'porcelain', 'kitchen-mugs', 'Country only. Mugs and cups; price them as plain.'),
  u('sweden-signed', 'Signed Sweden', ['Sweden', 'SWEDEN', 'Swed'], 'incised', 'Sweden', [1950, 1985], 'low', 'milk-glass', 'glass-art', 'Diamond-point "Sweden" with no name. Weight and the polished pontil matter more than the mark.'),
  u('pattern-woodland-fern', 'Pattern name only: Woodland Fern', ['"WOODLAND FERN"', 'Woodland Fern', 'WOODL ND FERN'], 'printed', '', [1945, 1975], 'low', 'earthenware', 'pottery-dinnerware', 'Pattern name with no maker. Match it by the border and list it by the pattern name.'),
  u('hand-painted', 'Hand Painted only', ['Hand Painted', 'HAND PAINTED', 'Hand Pai'], 'painted', '', [null, null], 'low', 'porcelain', 'pottery-figurines', 'Gives no maker and no date. Look for a faded country stamp beside it.'),
  u('hand-carved', '"Genuine Hand Carved" label', ['GENUINE HAND CARVED', 'Genuine Handcarved', 'HAND CARV'], 'paper_label', '', [null, null], 'low', 'wood', 'decor-carved-wood', 'Often on machine-roughed pieces. Look for real knife facets.'),
  u('quillmont-zone', 'Hand decorated, Quillmont zone label', ['HAND DECORATED Quillmont 4, Pa.', 'Hand Decorated Quillmont 4, Pa.', '...ECORATED Quillmont 4, Pa.'], 'paper_label', 'United States', [1946, 1962], 'high', 'earthenware', 'pottery-planters', 'A decorating shop, not a pottery. The zone number dates the label to 1943–1963.'),
  u('price-sticker', 'Barcode price sticker', [`PRICE 3.99 ${PRICE_STICKER}`, PRICE_STICKER, 'PRICE 3.99'], 'paper_label', '', [1976, null], 'medium', 'plastic', 'toys-board-games', 'A shop sticker, not a maker\'s mark, but the barcode says 1973 or later.'),
]

function years(r: Rand, window: Window, row: MakerRow | null, openEnded: boolean): [number, number | null] | null {
  const lo = Math.max(window[0] ?? 1880, row ? Number(row.from.replace('~', '')) : 1880)
  const makerTo = row?.to ? Number(row.to.replace('~', '')) : null
  const hi = Math.min(window[1] ?? LAST_YEAR, makerTo ?? LAST_YEAR)
  if (lo > hi) return null
  const from = lo + Math.floor(r() * (hi - lo) * 0.5)
  const to = from + Math.floor((hi - from) * (0.3 + 0.7 * r()))
  return openEnded && makerTo === null && window[1] === null && r() < 0.5 ? [from, null] : [from, to]
}

function materialsFor(r: Rand, line: ProductLine, from: number): DemoMaterialKey[] {
  const allowed = LINES[line].materials.filter(m => !(m === 'plastic' && from < 1950) && !(m === 'resin' && from < 1975))
  return [pick(r, allowed.length ? allowed : LINES[line].materials)]
}

function stampOf(row: MakerRow): string {
  return (row.country === 'Japan' ? row.otherNames[0]! : row.name).toUpperCase()
}

function shortName(row: MakerRow): string {
  return row.name.replace(/,? (Co\.|Ltd\.|Inc\.|KG|Mfg\. Co\.)$/, '')
}

function context(r: Rand, row: MakerRow, pattern: string, from: number): Ctx {
  const [town = '', state = ''] = row.place.split(', ')
  return { r, stamp: stampOf(row), name: row.name, town, state, country: row.country, pattern, from }
}

function priceNote(r: Rand, line: ProductLine): string {
  const p = int(r, 6, 30)
  const q = p + int(r, 8, 40)
  return pick(r, LINES[line].sells).replace('{p}', `$${p}`).replace('{q}', `$${q}`)
}

// The team's own asides; the stores are invented, like the rest of the scenario.
const ASIDES = [
  'Maren found the first one at the Hollowbrook Hospice Thrift.',
  'Theo keeps a tray of these for the spring market.',
  'Priya saw a whole shelf of them at the Larch Street estate sale.',
  'Sam checks the Tuesday markdowns at the Second Chance Barn for these.',
  'The Second Chance Barn prices these high; wait for the half-price day.',
  'Easy to miss: tilt the base to the light.',
]

function teamNote(r: Rand, line: ProductLine, hint: string): string {
  const note = `${priceNote(r, line)} ${hint}`.trim()
  return note.length < 140 && r() < 0.5 ? `${note} ${pick(r, ASIDES)}` : note
}

function makerMarks(row: MakerRow): DemoMark[] {
  const r = mulberry32(SEED ^ hash(row.key))
  const profile = LINES[row.line]
  const specs = LOOKALIKE_SPECS.filter(s => s.original === row.key)
  const patterns = shuffle(r, PATTERNS.filter(p => !LOOKALIKE_SPECS.some(s => s.pattern === p)))
  const marks: DemoMark[] = specs.map(spec => signatureMark(r, row, spec))
  const wanted = int(r, 2, 5) - marks.length
  const fitting = shuffle(r, TEMPLATES.filter(t => (t.us === undefined || t.us === (row.country === 'United States'))
    && (!t.lines || t.lines.includes(row.line)) && (!t.fits || t.fits(row))))
  for (const template of fitting) {
    if (marks.length >= specs.length + Math.max(1, wanted)) break
    const window = windowOf(template, row.country)
    const span = years(r, window, row, template.openEnded ?? true)
    if (!span) continue
    const pattern = patterns[marks.length % patterns.length]!
    const ctx = context(r, row, pattern, span[0])
    const full = template.text(ctx)
    const allowedTypes = template.types.filter(t => profile.types.includes(t))
    const markType = pick(r, allowedTypes.length ? allowedTypes : profile.types)
    marks.push({
      key: `${row.key}-${template.id}`,
      makerKey: row.key,
      title: `${shortName(row)} ${template.label.replace('{P}', pattern)}`,
      inscriptions: inscriptionVariants(r, full),
      markType,
      colour: pick(r, COLOURS[markType]),
      position: pick(r, profile.positions),
      yearFrom: span[0],
      yearTo: span[1],
      dateConfidence: template.confidence,
      country: row.country,
      materialKeys: materialsFor(r, row.line, span[0]),
      categoryKeys: [pick(r, profile.categories)],
      tags: [row.line, template.id, slug(row.country)],
      notes: teamNote(r, row.line, template.hint(ctx)),
    })
  }
  return marks
}

function signatureMark(r: Rand, row: MakerRow, spec: LookalikeSpec): DemoMark {
  const us = row.country === 'United States'
  const template = TEMPLATES.find(t => t.id === (us ? 'signature-us' : 'signature'))!
  const span = years(r, windowOf(template, row.country), row, false)!
  const ctx = context(r, row, spec.pattern, span[0])
  const markType = pick(r, LINES[row.line].types)
  return {
    key: signatureKey(spec),
    makerKey: row.key,
    title: `${shortName(row)} "${spec.pattern}" mark`,
    inscriptions: inscriptionVariants(r, template.text(ctx)),
    markType,
    colour: pick(r, COLOURS[markType]),
    position: pick(r, LINES[row.line].positions),
    yearFrom: span[0],
    yearTo: span[1],
    dateConfidence: 'medium',
    country: row.country,
    materialKeys: materialsFor(r, row.line, span[0]),
    categoryKeys: [spec.categories[0]!],
    tags: [row.line, 'signature-pattern', 'has-lookalikes'],
    notes: `${priceNote(r, row.line)} The pattern that gets copied: check the look-alike note before paying the full price.`,
  }
}

function copyMark(spec: LookalikeSpec): DemoMark {
  const r = mulberry32(SEED ^ hash(copyKey(spec)))
  const original = MAKER_ROWS.find(m => m.key === spec.original)!
  const copier = MAKER_ROWS.find(m => m.key === spec.copier)
  return {
    key: copyKey(spec),
    makerKey: spec.copier,
    title: `"${spec.pattern}" look-alike${copier ? ` by ${shortName(copier)}` : ''}, ${spec.country}`,
    inscriptions: inscriptionVariants(r, spec.text),
    markType: spec.markType,
    colour: pick(r, COLOURS[spec.markType]),
    position: 'base',
    yearFrom: spec.years[0],
    yearTo: spec.years[1],
    dateConfidence: 'medium',
    country: spec.country,
    materialKeys: [spec.material],
    categoryKeys: [...spec.categories],
    tags: ['lookalike', slug(spec.country)],
    notes: `Made to look like the ${shortName(original)} "${spec.pattern}" pattern. We price it at about a third of the original.`,
  }
}

function unknownMarks(): DemoMark[] {
  return UNKNOWN_MARKS.map(u => ({
    key: `unknown-${u.key}`,
    makerKey: null,
    title: u.title,
    inscriptions: [...u.inscriptions],
    markType: u.markType,
    colour: COLOURS[u.markType][0]!,
    position: u.position,
    yearFrom: u.years[0],
    yearTo: u.years[1],
    dateConfidence: u.confidence,
    country: u.country,
    materialKeys: [u.material],
    categoryKeys: [u.category],
    tags: ['unknown-maker'],
    notes: u.notes,
  }))
}

export function buildMarks(): DemoMark[] {
  return [...MAKER_ROWS.flatMap(makerMarks), ...LOOKALIKE_SPECS.map(copyMark), ...unknownMarks()]
}
