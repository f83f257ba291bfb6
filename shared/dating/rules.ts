// The dating clues as data: one row per clue of trade-facts section 1. Patterns run over the
// normalised text (see normalise.ts): lower case, dots as spaces, so "U.S.S.R." reads "u s s r".
// Years are inclusive calendar years; a clue says "probably", never "proves".
import { findSpans, originalSlice } from './normalise'
import type { NormalisedText, TextSpan } from './normalise'

export type Confidence = 'high' | 'medium' | 'low'

export interface YearRange {
  yearFrom: number | null
  yearTo: number | null
}

/** For clues a single regular expression cannot state, e.g. "Nippon" only when "Japan" is not also named. */
export type Matcher = (text: NormalisedText) => TextSpan[]

export interface DatingRule {
  id: string
  label: string
  pattern: RegExp | Matcher
  /** Inclusive; null = open. Both null and no `ranges` = an informational clue that sets no limit. */
  yearFrom: number | null
  yearTo: number | null
  /** Only for a clue that is an either-or ("Russia": before 1917 or after 1991); yearFrom/yearTo then span it. */
  ranges?: readonly YearRange[]
  reason: string
  source: string
  confidence: Confidence
  /** Rules whose matches this one supersedes where their matched words overlap ("Occupied Japan" over "Japan"). */
  excludes?: string[]
}

// ---------- pattern helpers ----------

/**
 * A whole-word pattern: a space in `source` stands for one space or line break, and the match may
 * not start or end inside a word of any script (JavaScript's \b only knows ASCII).
 */
function words(source: string): RegExp {
  return new RegExp(`(?<![\\p{L}\\p{N}])(?:${source.replaceAll(' ', '\\s')})(?![\\p{L}\\p{N}])`, 'u')
}

/** Alternation of plain phrases, longest first so "northern ireland" wins over "ireland". */
function anyOf(phrases: readonly string[]): string {
  return [...phrases]
    .sort((a, b) => b.length - a.length)
    .map(p => p.replace(/[.*+?^${}()|[\]\\]/g, '\\$&'))
    .join('|')
}

function matches(pattern: RegExp, text: NormalisedText): boolean {
  return findSpans(pattern, text.text).length > 0
}

// ---------- word lists ----------

// English country names and a few cheap variant spellings 19 CFR 134.45 accepts ("Brasil", "Italie").
// Left out on purpose: names with their own rule below (Japan, China, USSR, ...), the USA (goods
// made there were not under the import-marking law), and names that are common words on a base
// ("Turkey" platters, "Georgia" the state, "Jordan", "Chad").
const COUNTRY_NAMES = [
  'argentina', 'australia', 'austria', 'belgium', 'belgique', 'brazil', 'brasil', 'britain',
  'great britain', 'gt britain', 'united kingdom', 'u k', 'uk', 'bulgaria', 'canada', 'ceylon', 'chile',
  'colombia', 'croatia', 'cuba', 'cyprus', 'czech republic', 'czechia', 'denmark', 'ecuador', 'egypt',
  'eire', 'england', 'estonia', 'finland', 'france', 'germany', 'greece', 'holland', 'netherlands',
  'hong kong', 'hongkong', 'hungary', 'iceland', 'india', 'indonesia', 'iran', 'persia', 'ireland',
  'northern ireland', 'israel', 'italy', 'italia', 'italie', 'korea', 'latvia', 'lithuania',
  'luxembourg', 'macau', 'macao', 'malaysia', 'malta', 'mexico', 'morocco', 'new zealand', 'norway',
  'pakistan', 'peru', 'philippines', 'poland', 'portugal', 'romania', 'rumania', 'russia', 'scotland',
  'serbia', 'singapore', 'slovakia', 'slovenia', 'south africa', 'spain', 'espana', 'sri lanka',
  'sweden', 'switzerland', 'suisse', 'taiwan', 'formosa', 'republic of china', 'thailand', 'tunisia',
  'ukraine', 'vietnam', 'viet nam', 'wales',
]

// Adjectival forms count only beside "made"/"make": alone they are pattern names ("French Provincial").
const COUNTRY_ADJECTIVES = [
  'australian', 'austrian', 'belgian', 'brazilian', 'british', 'canadian', 'chinese', 'czech', 'danish',
  'dutch', 'english', 'finnish', 'french', 'german', 'greek', 'hungarian', 'indian', 'irish', 'italian',
  'japanese', 'korean', 'mexican', 'norwegian', 'polish', 'portuguese', 'russian', 'scottish', 'spanish',
  'swedish', 'swiss', 'welsh',
]

// "New England", "New Mexico" are US places, not countries of origin.
const COUNTRY_OF_ORIGIN = words(
  `(?<!new )(?:${anyOf(COUNTRY_NAMES)})|(?:${anyOf(COUNTRY_ADJECTIVES)}) (?:made|make|manufacture)`,
)

// US postal abbreviations (USPS Publication 59, October 1963; the territories from memory). Nebraska has its own rules.
const STATE_CODES = [
  'al', 'ak', 'az', 'ar', 'ca', 'co', 'ct', 'de', 'dc', 'fl', 'ga', 'hi', 'id', 'il', 'in', 'ia', 'ks',
  'ky', 'la', 'me', 'md', 'ma', 'mi', 'mn', 'ms', 'mo', 'mt', 'nv', 'nh', 'nj', 'nm', 'ny', 'nc', 'nd',
  'oh', 'ok', 'or', 'pa', 'ri', 'sc', 'sd', 'tn', 'tx', 'ut', 'vt', 'va', 'wa', 'wv', 'wi', 'wy', 'pr',
  'vi', 'gu',
]
const STATE_NAMES = [
  'alabama', 'alaska', 'arizona', 'arkansas', 'california', 'colorado', 'connecticut', 'delaware',
  'florida', 'georgia', 'hawaii', 'idaho', 'illinois', 'indiana', 'iowa', 'kansas', 'kentucky',
  'louisiana', 'maine', 'maryland', 'massachusetts', 'michigan', 'minnesota', 'mississippi', 'missouri',
  'montana', 'nebraska', 'nevada', 'new hampshire', 'new jersey', 'new mexico', 'new york',
  'north carolina', 'north dakota', 'ohio', 'oklahoma', 'oregon', 'pennsylvania', 'rhode island',
  'south carolina', 'south dakota', 'tennessee', 'texas', 'utah', 'vermont', 'virginia', 'washington',
  'west virginia', 'wisconsin', 'wyoming', 'district of columbia', 'puerto rico',
]
// Abbreviations used before 1963, dots already turned to spaces ("N.Y." → "n y"). From memory.
const OLD_STATE_ABBREVIATIONS = [
  'ala', 'ariz', 'ark', 'cal', 'calif', 'colo', 'conn', 'del', 'fla', 'ga', 'ill', 'ind', 'kan', 'kans',
  'ky', 'la', 'md', 'mass', 'mich', 'minn', 'miss', 'mo', 'mont', 'neb', 'nebr', 'nev', 'n h', 'n j',
  'n m', 'n mex', 'n y', 'n c', 'n d', 'n dak', 'okla', 'ore', 'oreg', 'pa', 'penn', 'r i', 's c', 's d',
  's dak', 'tenn', 'tex', 'vt', 'va', 'wash', 'w va', 'wis', 'wisc', 'wyo', 'd c',
]
const ANY_STATE = anyOf([...STATE_NAMES, ...OLD_STATE_ABBREVIATIONS, ...STATE_CODES, 'ne', 'nb'])
const ZIP_CONTEXT = `(?:${ANY_STATE}|zip(?: code)?),? `

const USSR = words(
  `(?:made in (?:the )?)?(?:u ?s ?s ?r|soviet union|union of soviet socialist republics|[\\u0441c]{3}[\\u0440p])`,
)

// ---------- matchers ----------

/** "Nippon" dates a piece only as the sole country name; next to "Japan" it is part of a firm's name. */
function nipponAlone(text: NormalisedText): TextSpan[] {
  if (matches(words('japan'), text)) return []
  return findSpans(words('(?:made in )?nippon'), text.text)
}

/** "Russia" dates a piece only when the inscription does not also name the USSR. */
function russiaAlone(text: NormalisedText): TextSpan[] {
  if (matches(USSR, text)) return []
  return findSpans(words('(?:made in )?(?:russia|\\u0440\\u043e\\u0441\\u0441\\u0438\\u044f)'), text.text)
}

const CHINA_EXPLICIT = words(
  'made in (?:the )?(?:peoples republic of |p ?r ?)?china|peoples republic of china|p ?r ?china|p ?r ?c',
)

/**
 * Bare "China" is usually the material ("Millbrook China", "Fine Bone China"), even alone on a line
 * of a stacked backstamp, so it counts as the country only when it is all the inscription says or
 * all the country field says.
 */
function china(text: NormalisedText): TextSpan[] {
  const spans = findSpans(CHINA_EXPLICIT, text.text)
  const inscription = text.text.slice(0, text.countryFieldStart ?? undefined).trim()
  const country = text.countryFieldStart === null ? '' : text.text.slice(text.countryFieldStart)
  if (inscription === 'china') spans.push({ start: 0, end: 5 })
  if (country === 'china') spans.push({ start: text.countryFieldStart!, end: text.countryFieldStart! + 5 })
  return spans
}

/**
 * A 1963 two-letter state code after "Town, ": "Dayton, OH". Pre-1963 abbreviations such as "Pa." or
 * "Ga." look the same once dots are gone, so a code written with a dot or in title case is refused.
 */
function stateCodeAfterTown(codes: readonly string[]): Matcher {
  const pattern = new RegExp(
    `(?<![\\p{L}\\p{N}])\\p{L}+,\\s(?<code>${anyOf(codes)})(?=$|[\\n,]|\\s\\d{5}(?!\\d)|\\s(?:usa|u\\ss\\sa)(?![\\p{L}]))`,
    'gud',
  )
  return (text) => {
    const spans: TextSpan[] = []
    for (const match of text.text.matchAll(pattern)) {
      const [codeStart, codeEnd] = match.indices!.groups!.code!
      const written = originalSlice(text, { start: codeStart, end: codeEnd })
      const dotAfter = text.original[text.sourceEnd[codeEnd - 1]!] === '.'
      if (dotAfter || /^\p{Lu}\p{Ll}$/u.test(written)) continue
      spans.push({ start: match.index, end: match.index + match[0].length })
    }
    return spans
  }
}

/** Twelve digits (grouped or not) whose last digit is the UPC-A check digit. */
function upcBarcode(text: NormalisedText): TextSpan[] {
  return findSpans(/(?<![\d-])\d(?:[ -]?\d){11}(?![ -]?\d)/, text.text).filter((span) => {
    const digits = text.text.slice(span.start, span.end).replace(/\D/g, '').split('').map(Number)
    const weighted = digits.slice(0, 11).reduce((sum, d, i) => sum + (i % 2 === 0 ? 3 * d : d), 0)
    return (10 - (weighted % 10)) % 10 === digits[11]
  })
}

// ---------- the table ----------

const MCKINLEY = 'US Tariff Act of 1 Oct 1890 ("McKinley Tariff"), section 6: marking in legible English words from 1 Mar 1891'
const USSR_SOURCE = 'Treaty on the Creation of the USSR, 30 Dec 1922; dissolution 26 Dec 1991'
const STATE_CODE_SOURCE = 'USPS state abbreviations history: Publication 59, 1 Oct 1963; Nebraska "NB" changed to "NE" in 1969'

export const DATING_RULES: DatingRule[] = [
  {
    id: 'country-of-origin',
    label: 'Country of origin',
    pattern: COUNTRY_OF_ORIGIN,
    yearFrom: 1891,
    yearTo: null,
    reason: 'Imports to the US had to name their country of origin in English from 1 March 1891, so a marked piece was probably made then or later. A missing country name proves nothing.',
    source: `${MCKINLEY}; 19 U.S.C. 1304; 19 CFR 134.45 (abbreviations, variant spellings, adjectival forms)`,
    confidence: 'medium',
  },
  {
    id: 'nippon',
    label: 'Nippon',
    pattern: nipponAlone,
    yearFrom: 1891,
    yearTo: 1921,
    reason: 'US Customs accepted "Nippon" as the country name until 1921, then required "Japan". Fake "Nippon" marks exist on reproductions, so this is never decisive on its own.',
    source: `${MCKINLEY}; secondary sources on the 1921 US Customs ruling`,
    confidence: 'medium',
    excludes: ['country-of-origin'],
  },
  {
    id: 'japan',
    label: 'Japan',
    pattern: words('(?:made in )?japan'),
    yearFrom: 1921,
    yearTo: null,
    reason: 'Mostly 1921 or later, when US Customs stopped accepting "Nippon" (a few pieces say "Japan" earlier). No Japanese exports reached the US from December 1941 to about August 1947, so those years are unlikely.',
    source: 'Secondary sources on the 1921 US Customs ruling',
    confidence: 'medium',
    excludes: ['country-of-origin'],
  },
  {
    id: 'occupied-japan',
    label: 'Occupied Japan',
    pattern: words('(?:made in )?occupied japan'),
    yearFrom: 1947,
    yearTo: 1952,
    reason: 'Required on exports from 20 February 1947; plain "Japan" was allowed again from December 1949 and the occupation ended on 28 April 1952.',
    source: 'SCAPIN-1535 (20 Feb 1947); SCAPIN-2061 (5 Dec 1949); Treaty of San Francisco in force 28 Apr 1952',
    confidence: 'high',
    excludes: ['japan', 'country-of-origin'],
  },
  {
    id: 'west-germany',
    label: 'West Germany',
    pattern: words(
      '(?:made in )?(?:(?:w|west|western) ?germany|germany ?\\( ?west ?\\)|federal republic of germany)',
    ),
    yearFrom: 1949,
    yearTo: 1990,
    reason: 'The Federal Republic existed from 23 May 1949 until reunification on 3 October 1990; allow a short run-out of old stock and moulds after 1990.',
    source: 'Basic Law of the Federal Republic, 23 May 1949; German reunification 3 Oct 1990',
    confidence: 'high',
    excludes: ['country-of-origin'],
  },
  {
    id: 'east-germany',
    label: 'East Germany (GDR)',
    pattern: words(
      '(?:made in (?:the )?)?(?:east ?germany|german democratic republic|deutsche demokratische republik|g ?d ?r|d ?d ?r)',
    ),
    yearFrom: 1949,
    yearTo: 1990,
    reason: 'The German Democratic Republic existed from 7 October 1949 until reunification on 3 October 1990.',
    source: 'Founding of the GDR, 7 Oct 1949; German reunification 3 Oct 1990',
    confidence: 'high',
    excludes: ['country-of-origin'],
  },
  {
    id: 'czechoslovakia',
    label: 'Czechoslovakia',
    pattern: words('(?:made in )?(?:czecho ?slovakia|czechoslovak socialist republic|c ?s ?s ?r)'),
    yearFrom: 1918,
    yearTo: 1992,
    reason: 'Czechoslovakia existed from 28 October 1918 to 31 December 1992; it was not a state from 1939 to 1945, so those years are unlikely.',
    source: 'Independence 28 Oct 1918; dissolution of Czechoslovakia 1 Jan 1993',
    confidence: 'high',
    excludes: ['country-of-origin'],
  },
  {
    id: 'ussr',
    label: 'USSR',
    pattern: USSR,
    yearFrom: 1922,
    yearTo: 1991,
    reason: 'The Soviet Union existed from 30 December 1922 to 26 December 1991 ("СССР" is its Cyrillic abbreviation, often typed as Latin "CCCP").',
    source: USSR_SOURCE,
    confidence: 'high',
    excludes: ['country-of-origin'],
  },
  {
    id: 'russia',
    label: 'Russia',
    pattern: russiaAlone,
    // An either-or, kept as two ranges rather than flattened into "any date".
    yearFrom: null,
    yearTo: null,
    ranges: [
      { yearFrom: null, yearTo: 1917 },
      { yearFrom: 1991, yearTo: null },
    ],
    reason: '"Russia" without "USSR" points to before the 1917 revolution or after the Soviet Union ended in December 1991, not to the Soviet years in between.',
    source: USSR_SOURCE,
    confidence: 'medium',
  },
  {
    id: 'yugoslavia',
    label: 'Yugoslavia',
    pattern: words('(?:made in )?(?:yugoslavia|jugoslavia|jugoslavija)'),
    yearFrom: 1929,
    yearTo: 2003,
    reason: 'The name was used from 3 October 1929 to 4 February 2003; most socialist-era goods date from 1945 to 1991.',
    source: 'Renaming of the Kingdom to Yugoslavia, 3 Oct 1929; renaming to Serbia and Montenegro, 4 Feb 2003',
    confidence: 'high',
    excludes: ['country-of-origin'],
  },
  {
    id: 'china',
    label: 'China (People\'s Republic)',
    pattern: china,
    yearFrom: 1971,
    yearTo: null,
    reason: 'The US embargo on trade with the People\'s Republic (1950) was lifted on 10 June 1971, so goods for the US marked China are mostly later. A bare "PRC" does not satisfy US Customs, so it usually appears with other marks. A bare "China" counts only when it is the whole inscription or the whole country field, because it is usually the material ("bone china").',
    source: 'White House announcement of 10 Jun 1971; CBP rulings HQ 560693 (1998) and N262161 (2015)',
    confidence: 'high',
    excludes: ['country-of-origin'],
  },
  {
    id: 'hong-kong',
    label: 'Hong Kong',
    pattern: words('(?:made in )?hong ?kong'),
    yearFrom: null,
    yearTo: null,
    reason: 'Not a pre-1997 clue: goods made after the handover on 1 July 1997 are still marked "Hong Kong". Only the general country-of-origin date (1891) applies.',
    source: 'CBP rulings on Hong Kong marking',
    confidence: 'high',
  },
  {
    id: 'england',
    label: 'England',
    pattern: words('(?<!new )england'),
    yearFrom: 1891,
    yearTo: null,
    reason: 'A country name as required by the US marking law from 1891 (a few pieces from the 1880s).',
    source: MCKINLEY,
    confidence: 'medium',
    excludes: ['country-of-origin'],
  },
  {
    id: 'made-in-england',
    label: 'Made in England',
    pattern: words('made in england'),
    yearFrom: 1921,
    yearTo: null,
    reason: 'Mostly 20th century, about 1921 or later. A collectors\' rule of thumb: no law required the words "Made in".',
    source: 'Rule of thumb among collectors (common practice, no published source); 19 CFR 134.46 requires "Made in" only where another place name could mislead',
    confidence: 'low',
    excludes: ['england', 'country-of-origin'],
  },
  {
    id: 'foreign',
    label: 'Foreign',
    pattern: words('foreign'),
    yearFrom: 1887,
    yearTo: null,
    reason: 'Marked for the UK market under the Merchandise Marks Act 1887. "Foreign" does not meet the US rule of an English country name.',
    source: 'Merchandise Marks Act 1887; Hansard, 28 Feb 1888, on labels under the Act',
    confidence: 'low',
  },
  {
    id: 'bavaria',
    label: 'Bavaria',
    pattern: words('bavaria'),
    yearFrom: null,
    yearTo: null,
    reason: 'Bavaria is a region, not a country after 1871: it gives no date by itself. Look for "Germany" beside it.',
    source: 'From memory',
    confidence: 'low',
  },
  {
    id: 'registered-sign',
    label: 'Registered trademark sign ®',
    pattern: /®|\(\s?r\s?\)/u,
    yearFrom: 1947,
    yearTo: null,
    reason: 'The ® symbol was introduced by the Lanham Act, in force 5 July 1947; on US goods it means 1947 or later.',
    source: 'Lanham Act, 15 U.S.C. 1111 (signed 5 Jul 1946, in force 5 Jul 1947)',
    confidence: 'high',
  },
  {
    id: 'reg-us-pat-off',
    label: 'Reg. U.S. Pat. Off.',
    pattern: words('reg(?:istered|d)? (?:in (?:the )?)?u ?s pat(?:ent)? off(?:ice)?'),
    yearFrom: 1905,
    yearTo: null,
    reason: 'A trademark registered under the Trademark Act of 1905; still used after 1947, so it sets no upper limit.',
    source: 'Trademark Act of 1905 (from memory)',
    confidence: 'medium',
  },
  {
    id: 'reg-us-pat-tm-off',
    label: 'Reg. U.S. Pat. & Tm. Off.',
    pattern: words(
      'reg(?:istered|d)? (?:in (?:the )?)?u ?s pat(?:ent)? ?(?:&|and) ?(?:t ?m|trademark|trade mark) ?off(?:ice)?',
    ),
    yearFrom: 1975,
    yearTo: null,
    reason: 'The Patent Office was renamed the Patent and Trademark Office on 2 January 1975.',
    source: 'Pub. L. 93-596 (in force 2 Jan 1975)',
    confidence: 'high',
    excludes: ['reg-us-pat-off'],
  },
  {
    id: 'zip-code',
    label: 'ZIP code',
    pattern: words(`${ZIP_CONTEXT}\\d{5}(?!\\d)`),
    yearFrom: 1963,
    yearTo: null,
    reason: 'Five-digit ZIP codes began on 1 July 1963. A five-digit number counts only after a US state name or code.',
    source: 'US Post Office Department, ZIP Code launch 1 Jul 1963',
    confidence: 'high',
  },
  {
    id: 'zip-plus-4',
    label: 'ZIP+4 code',
    pattern: words(`${ZIP_CONTEXT}\\d{5}-\\d{4}`),
    yearFrom: 1983,
    yearTo: null,
    reason: 'Nine-digit ZIP+4 codes began in 1983.',
    source: 'US Postal Service, ZIP+4 introduced 1983',
    confidence: 'high',
    excludes: ['zip-code'],
  },
  {
    id: 'state-code',
    label: 'Two-letter state code',
    pattern: stateCodeAfterTown(STATE_CODES),
    yearFrom: 1963,
    yearTo: null,
    reason: 'Two-letter state codes after a town ("Dayton, OH") began with Publication 59 in October 1963; before that states were written out or abbreviated like "Pa." or "Ill.".',
    source: STATE_CODE_SOURCE,
    confidence: 'high',
  },
  {
    id: 'state-code-ne',
    label: 'Nebraska code NE',
    pattern: stateCodeAfterTown(['ne']),
    yearFrom: 1969,
    yearTo: null,
    reason: '"NE" has stood for Nebraska since 1969; from 1963 to 1969 the code was "NB".',
    source: STATE_CODE_SOURCE,
    confidence: 'high',
  },
  {
    id: 'state-code-nb',
    label: 'Nebraska code NB',
    pattern: stateCodeAfterTown(['nb']),
    yearFrom: 1963,
    yearTo: 1969,
    reason: '"NB" was Nebraska\'s code from 1963 until 1969, when it became "NE" (NB is also New Brunswick in Canada).',
    source: STATE_CODE_SOURCE,
    confidence: 'high',
  },
  {
    id: 'postal-zone',
    label: 'Old postal zone',
    pattern: words(`\\p{L}+ \\d{1,2},? (?:${anyOf([...STATE_NAMES, ...OLD_STATE_ABBREVIATIONS])})(?! ?\\d)`),
    yearFrom: 1943,
    yearTo: 1963,
    reason: 'Postal zone numbers after the city ("Chicago 16, Ill.") were used from 1943 until ZIP codes replaced them in 1963.',
    source: 'US postal zones introduced 1943; replaced by ZIP codes 1963',
    confidence: 'high',
  },
  {
    id: 'upc-barcode',
    label: 'UPC barcode',
    pattern: upcBarcode,
    yearFrom: 1973,
    yearTo: null,
    reason: 'The 12-digit UPC symbol was adopted in 1973 and first scanned at a till on 26 June 1974; a label carrying one is from 1973 or later.',
    source: 'UPC symbol adopted 1973; first retail scan 26 Jun 1974',
    confidence: 'high',
  },
  {
    id: 'microwave',
    label: 'Microwave use',
    pattern: words('micro ?wav(?:es|e|able|eable)(?: (?:oven )?(?:safe|proof))?'),
    yearFrom: 1967,
    yearTo: null,
    reason: 'Any microwave wording ("microwave safe", "not for microwave") follows the first countertop home microwave oven of 1967; realistically the late 1970s or later.',
    source: 'History of the home microwave oven (first countertop model 1967)',
    confidence: 'medium',
    excludes: ['oven-proof'],
  },
  {
    id: 'dishwasher',
    label: 'Dishwasher use',
    pattern: words('dish ?washers?(?: (?:safe|proof))?'),
    yearFrom: 1950,
    yearTo: null,
    reason: 'Dishwasher wording on tableware is about the 1950s or later.',
    source: 'From memory',
    confidence: 'low',
  },
  {
    id: 'oven-proof',
    label: 'Oven proof',
    pattern: words('oven ?(?:proof|safe)'),
    yearFrom: 1920,
    yearTo: null,
    reason: '"Oven proof" wording is about the 1920s–30s or later.',
    source: 'From memory',
    confidence: 'low',
  },
]
