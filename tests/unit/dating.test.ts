// Checks the dating-clue engine against the published dates it rests on (trade-facts section 1).
// Expected years are written out here independently of the rule table, each with its source in the
// test name or beside the check; rules of thumb say "common practice, no published source" and
// values that rest on memory say "from memory". All makers and towns in examples are invented.
import { describe, it, expect } from 'vitest'
import { existsSync, readFileSync } from 'node:fs'
import { DATING_RULES, findDatingClues, normaliseInscription, originalSlice } from '../../shared/dating'

// ---------- helpers ----------

const rulesFound = (text: string, country?: string | null) =>
  findDatingClues(text, country).clues.map(clue => clue.rule)

const clueFor = (text: string, rule: string, country?: string | null) =>
  findDatingClues(text, country).clues.find(clue => clue.rule === rule)

/** The rule fires on `text` with exactly these years. */
function expectClue(text: string, rule: string, yearFrom: number | null, yearTo: number | null) {
  const clue = clueFor(text, rule)
  expect(clue, `${rule} should fire on ${JSON.stringify(text)}`).toBeDefined()
  expect([clue!.yearFrom, clue!.yearTo]).toEqual([yearFrom, yearTo])
}

function expectRange(text: string, yearFrom: number | null, yearTo: number | null, country?: string | null) {
  const result = findDatingClues(text, country)
  expect(result.conflict).toBe(false)
  expect(result.range).toEqual({ yearFrom, yearTo })
}

// ---------- the table itself ----------

// One inscription per rule, so a rule added without a test fails here.
const POSITIVE_EXAMPLES: Record<string, string> = {
  'country-of-origin': 'Made in France',
  'nippon': 'Hand painted Nippon',
  'japan': 'Made in Japan',
  'occupied-japan': 'Made in Occupied Japan',
  'west-germany': 'W. Germany',
  'east-germany': 'Made in GDR',
  'czechoslovakia': 'Made in Czechoslovakia',
  'ussr': 'Made in U.S.S.R.',
  'russia': 'Made in Russia',
  'yugoslavia': 'Made in Yugoslavia',
  'china': 'Made in China',
  'hong-kong': 'Made in Hong Kong',
  'england': 'England',
  'made-in-england': 'Made in England',
  'foreign': 'Foreign',
  'bavaria': 'Bavaria',
  'registered-sign': 'Millbrook®',
  'reg-us-pat-off': 'Reg. U.S. Pat. Off.',
  'reg-us-pat-tm-off': 'Reg. U.S. Pat. & Tm. Off.',
  'zip-code': 'Dayton, Ohio 45401',
  'zip-plus-4': 'Dayton, OH 45401-1234',
  'state-code': 'Dayton, OH',
  'state-code-ne': 'Lincoln, NE',
  'state-code-nb': 'Lincoln, NB',
  'postal-zone': 'Chicago 16, Ill.',
  'upc-barcode': '0 12345 67890 5',
  'microwave': 'Microwave safe',
  'dishwasher': 'Dishwasher safe',
  'oven-proof': 'Oven proof',
}

describe('DATING_RULES table', () => {
  it('has unique kebab-case ids', () => {
    const ids = DATING_RULES.map(rule => rule.id)
    expect(new Set(ids).size).toBe(ids.length)
    for (const id of ids) expect(id).toMatch(/^[a-z0-9]+(?:-[a-z0-9]+)*$/)
  })

  it('supersedes only rules that exist, never itself', () => {
    const ids = new Set(DATING_RULES.map(rule => rule.id))
    for (const rule of DATING_RULES) {
      for (const excluded of rule.excludes ?? []) {
        expect(ids.has(excluded), `${rule.id} excludes unknown ${excluded}`).toBe(true)
        expect(excluded).not.toBe(rule.id)
      }
    }
  })

  it('gives every rule a label, a reason, a source and ordered years', () => {
    for (const rule of DATING_RULES) {
      expect(rule.label.length, rule.id).toBeGreaterThan(0)
      expect(rule.reason.length, rule.id).toBeGreaterThan(20)
      expect(rule.source.length, rule.id).toBeGreaterThan(5)
      for (const range of [rule, ...(rule.ranges ?? [])]) {
        if (range.yearFrom !== null && range.yearTo !== null) expect(range.yearFrom).toBeLessThanOrEqual(range.yearTo)
      }
    }
  })

  it.each(DATING_RULES.map(rule => rule.id))('rule %s has a positive example that fires', (id) => {
    const example = POSITIVE_EXAMPLES[id]
    expect(example, `add an example for ${id} to POSITIVE_EXAMPLES`).toBeDefined()
    expect(rulesFound(example!)).toContain(id)
  })
})

// ---------- normalisation ----------

describe('normaliseInscription', () => {
  it.each([
    ['MADE IN W.GERMANY', 'made in w germany'],
    ['U.S.S.R.', 'u s s r'],
    ['  Made   in\t Japan ', 'made in japan'],
    ['Made in\n\n Japan', 'made in\njapan'],
    ['Töpferei Müller, Straße', 'topferei muller, strasse'],
    ['Hecho en España', 'hecho en espana'],
    ['People\'s Republic', 'peoples republic'],
    ['Dayton ,OH 45401-1234', 'dayton, oh 45401-1234'],
    ['Oven-proof', 'oven proof'],
    ['0-12345-67890-5', '0-12345-67890-5'],
    ['Germany (West)', 'germany (west)'],
  ])('%j → %j', (input, expected) => {
    expect(normaliseInscription(input).text).toBe(expected)
  })

  it('keeps Cyrillic as Cyrillic and says so', () => {
    const cyrillic = normaliseInscription('Сделано в СССР')
    expect(cyrillic.text).toBe('сделано в ссср')
    expect(cyrillic.hasCyrillic).toBe(true)
    expect(normaliseInscription('CCCP').hasCyrillic).toBe(false) // the Latin look-alike
  })

  it('keeps ® and says so', () => {
    const marked = normaliseInscription('Millbrook®')
    expect(marked.text).toBe('millbrook®')
    expect(marked.hasRegisteredSign).toBe(true)
    expect(normaliseInscription('Millbrook').hasRegisteredSign).toBe(false)
  })

  it('maps a span back to the words as typed', () => {
    const normalised = normaliseInscription('MADE IN W.GERMANY')
    const start = normalised.text.indexOf('w germany')
    expect(originalSlice(normalised, { start, end: start + 'w germany'.length })).toBe('W.GERMANY')
  })

  it('reads the country field as a last line and remembers where it starts', () => {
    const normalised = normaliseInscription('Hand painted', 'Nippon')
    expect(normalised.text).toBe('hand painted\nnippon')
    expect(normalised.text.slice(normalised.countryFieldStart!)).toBe('nippon')
    expect(normaliseInscription('Hand painted').countryFieldStart).toBeNull()
  })
})

// ---------- country names ----------

describe('country of origin: 1891 or later (US Tariff Act of 1 Oct 1890, "McKinley Tariff", s.6)', () => {
  it.each([
    'Made in France',
    'MADE IN ITALY',
    'Gt. Britain', // clear abbreviation accepted by 19 CFR 134.45
    'Made in Brasil', // variant spelling accepted by 19 CFR 134.45
    'Italie', // variant spelling accepted by 19 CFR 134.45
    'Hecho en España', // diacritics folded
    'German made', // adjectival form accepted by 19 CFR 134.45
    'Holland',
    'Made in Germany',
    'Made in Republic of China', // Taiwan, not the People's Republic
  ])('%j → 1891 or later', (text) => {
    expectClue(text, 'country-of-origin', 1891, null)
  })

  it.each([
    'French Provincial', // an adjective alone is a pattern name
    'Made in USA', // US goods were not under the import-marking law
    'Millbrook, New Mexico', // a US state
    'Turkey platter', // deliberately not in the country list
    'Indianapolis',
    'Fine Bone China',
  ])('%j is not a country of origin', (text) => {
    expect(rulesFound(text)).not.toContain('country-of-origin')
  })

  it('names every country it saw', () => {
    expect(clueFor('Made in France, decorated in Italy', 'country-of-origin')?.matched).toBe('France, Italy')
  })
})

describe('Nippon: 1891–1921 (secondary sources on the 1921 US Customs ruling)', () => {
  it.each(['Nippon', 'Hand Painted NIPPON', 'hand painted nippon', 'Made in Nippon'])('%j → 1891–1921', (text) => {
    expectClue(text, 'nippon', 1891, 1921)
    expect(rulesFound(text)).toEqual(['nippon']) // supersedes the general country rule
  })

  it('is never decisive alone: reproductions with fake Nippon marks exist', () => {
    expect(clueFor('Nippon', 'nippon')?.reason).toMatch(/reproduction/i)
    expect(clueFor('Nippon', 'nippon')?.confidence).toBe('medium')
  })

  it('does not count when "Japan" is also named (then Nippon is part of a firm\'s name)', () => {
    expect(rulesFound('Nippon Millbrook Toki, Made in Japan')).toEqual(['japan'])
  })

  it('is not found in other words', () => {
    expect(rulesFound('Nipponese')).toEqual([])
  })
})

describe('Japan: 1921 or later (secondary sources on the 1921 US Customs ruling)', () => {
  it.each(['Japan', 'Made in Japan', 'MADE IN JAPAN', 'made  in   japan', 'Made in\nJapan'])('%j → 1921 or later', (text) => {
    expectClue(text, 'japan', 1921, null)
    expect(rulesFound(text)).toEqual(['japan'])
  })

  it('mentions the gap in exports to the US, Dec 1941 – about Aug 1947', () => {
    expect(clueFor('Japan', 'japan')?.reason).toMatch(/1941.*1947/)
  })

  it('"Japan" alone does not trigger Occupied Japan', () => {
    expect(rulesFound('Made in Japan')).not.toContain('occupied-japan')
  })

  it.each(['Japanned tin tray', 'Japanese', 'Nippon'])('%j is not the Japan clue', (text) => {
    expect(rulesFound(text)).not.toContain('japan')
  })
})

describe('Occupied Japan: 1947–1952 (SCAPIN-1535 of 20 Feb 1947; Treaty of San Francisco in force 28 Apr 1952)', () => {
  it.each(['Occupied Japan', 'Made in Occupied Japan', 'MADE IN OCCUPIED JAPAN', 'made in occupied\njapan'])(
    '%j → 1947–1952, without the plain Japan clue',
    (text) => {
      expectClue(text, 'occupied-japan', 1947, 1952)
      expect(rulesFound(text)).toEqual(['occupied-japan'])
    },
  )

  it('keeps a separate plain "Japan" elsewhere on the piece', () => {
    expect(rulesFound('Occupied Japan; lid: Japan')).toEqual(['occupied-japan', 'japan'])
    expectRange('Occupied Japan; lid: Japan', 1947, 1952)
  })

  it.each(['Occupied', 'Japan'])('%j alone is not Occupied Japan', (text) => {
    expect(rulesFound(text)).not.toContain('occupied-japan')
  })
})

describe('West Germany: 1949–1990 (Basic Law, 23 May 1949; reunification, 3 Oct 1990)', () => {
  it.each([
    'West Germany',
    'W. Germany',
    'W.Germany',
    'MADE IN W.GERMANY',
    'w germany',
    'Western Germany',
    'West-Germany',
    'Germany (West)',
    'Made in Germany (West)',
    'GERMANY ( WEST )',
    'Federal Republic of Germany',
  ])('%j → 1949–1990', (text) => {
    expectClue(text, 'west-germany', 1949, 1990)
    expect(rulesFound(text)).toEqual(['west-germany']) // supersedes the "Germany" country clue
  })

  it('allows for a short run-out after 1990 in its reason', () => {
    expect(clueFor('W. Germany', 'west-germany')?.reason).toMatch(/run-out/)
  })

  it.each(['Germany', 'Made in Germany', 'East Germany', 'New Germany Works'])('%j is not West Germany', (text) => {
    expect(rulesFound(text)).not.toContain('west-germany')
  })
})

describe('East Germany (GDR): 1949–1990 (founding of the GDR, 7 Oct 1949; reunification, 3 Oct 1990)', () => {
  it.each(['GDR', 'G.D.R.', 'DDR', 'Made in GDR', 'East Germany', 'EAST-GERMANY', 'German Democratic Republic'])(
    '%j → 1949–1990',
    (text) => {
      expectClue(text, 'east-germany', 1949, 1990)
      expect(rulesFound(text)).toEqual(['east-germany'])
    },
  )

  it.each(['Germany', 'Address', 'W. Germany'])('%j is not the GDR', (text) => {
    expect(rulesFound(text)).not.toContain('east-germany')
  })
})

describe('Czechoslovakia: 1918–1992 (independence 28 Oct 1918; dissolution 1 Jan 1993)', () => {
  it.each(['Czechoslovakia', 'Made in Czechoslovakia', 'CZECHO-SLOVAKIA', 'Czecho Slovakia', 'ČSSR'])(
    '%j → 1918–1992',
    (text) => {
      expectClue(text, 'czechoslovakia', 1918, 1992)
    },
  )

  it('notes that it was not a state 1939–1945', () => {
    expect(clueFor('Czechoslovakia', 'czechoslovakia')?.reason).toMatch(/1939 to 1945/)
  })

  it.each(['Czech Republic', 'Slovakia'])('%j is a country name but not Czechoslovakia', (text) => {
    expect(rulesFound(text)).toEqual(['country-of-origin'])
  })
})

describe('USSR: 1922–1991 (Treaty on the Creation of the USSR, 30 Dec 1922; dissolution 26 Dec 1991)', () => {
  it.each(['USSR', 'U.S.S.R.', 'U. S. S. R.', 'Made in USSR', 'Soviet Union', 'СССР', 'Сделано в СССР', 'CCCP', 'cccp'])(
    '%j → 1922–1991',
    (text) => {
      expectClue(text, 'ussr', 1922, 1991)
    },
  )

  it('quotes the words as written', () => {
    expect(clueFor('Сделано в СССР', 'ussr')?.matched).toBe('СССР')
    expect(clueFor('Made in U.S.S.R.', 'ussr')?.matched).toBe('Made in U.S.S.R.')
  })

  it.each(['USS Ranger', 'Russia', 'CCCPX'])('%j is not the USSR', (text) => {
    expect(rulesFound(text)).not.toContain('ussr')
  })
})

describe('Russia alone: before 1917 or after 1991 (Treaty on the Creation of the USSR; dissolution 26 Dec 1991)', () => {
  it.each(['Russia', 'Made in Russia', 'RUSSIA', 'Россия'])('%j → an either-or: 1917 or earlier, or 1991 or later', (text) => {
    const clue = clueFor(text, 'russia')
    expect(clue?.ranges).toEqual([
      { yearFrom: null, yearTo: 1917 },
      { yearFrom: 1991, yearTo: null },
    ])
    expect([clue?.yearFrom, clue?.yearTo]).toEqual([null, null]) // the span of the either-or
  })

  it('with the country rule (McKinley Tariff, 1891) leaves two pieces: 1891–1917 or 1991 on', () => {
    const result = findDatingClues('Made in Russia')
    expect(result.ranges).toEqual([
      { yearFrom: 1891, yearTo: 1917 },
      { yearFrom: 1991, yearTo: null },
    ])
    expect(result.range).toEqual({ yearFrom: 1891, yearTo: null })
    expect(result.explanation).toContain('1891–1917, or 1991 or later')
  })

  it('does not count when the USSR is also named', () => {
    expect(rulesFound('Made in USSR, Russia')).not.toContain('russia')
  })

  it('is not found in "Russian"', () => {
    expect(rulesFound('Russian')).toEqual([])
  })
})

describe('Yugoslavia: 1929–2003 (renaming of the Kingdom, 3 Oct 1929; renaming to Serbia and Montenegro, 4 Feb 2003)', () => {
  it.each(['Yugoslavia', 'Made in Yugoslavia', 'JUGOSLAVIJA', 'Jugoslavia'])('%j → 1929–2003', (text) => {
    expectClue(text, 'yugoslavia', 1929, 2003)
  })

  it.each(['Slavia Pottery', 'Serbia'])('%j is not Yugoslavia', (text) => {
    expect(rulesFound(text)).not.toContain('yugoslavia')
  })
})

describe('China: 1971 or later (White House announcement of 10 Jun 1971; CBP rulings HQ 560693, N262161)', () => {
  it.each([
    'Made in China',
    'MADE IN CHINA',
    'Made in P.R. China',
    'Made in the People\'s Republic of China',
    'PRC',
    'P.R.C.',
    'China', // the whole inscription
  ])('%j → 1971 or later', (text) => {
    expectClue(text, 'china', 1971, null)
  })

  it('counts a bare "China" in the country field', () => {
    expect(rulesFound('Millbrook Pottery', 'China')).toEqual(['china'])
  })

  // Bare "China" is usually the material: common practice, no published source.
  it.each([
    'Fine Bone China',
    'Millbrook China\nMade in England',
    'MILLBROOK\nCHINA',
    'Made in Republic of China', // Taiwan
    'Chinaware',
  ])('%j is not the People\'s Republic', (text) => {
    expect(rulesFound(text)).not.toContain('china')
  })
})

describe('Hong Kong: no pre-1997 limit (CBP rulings on Hong Kong marking)', () => {
  it.each(['Hong Kong', 'Made in Hong Kong', 'HONGKONG'])('%j sets no limit itself; 1891 comes from the country rule (McKinley Tariff)', (text) => {
    expectClue(text, 'hong-kong', null, null)
    expectClue(text, 'country-of-origin', 1891, null)
    expectRange(text, 1891, null)
  })

  it('does not conflict with a clue from after the 1997 handover (ZIP+4, 1983 on)', () => {
    expectRange('Made in Hong Kong\nMillbrook Imports, Dayton, OH 45401-1234', 1983, null)
  })
})

describe('England alone: 1891 or later (McKinley Tariff)', () => {
  it.each(['England', 'ENGLAND', 'Fine Bone China, England', 'Millbrook\nEngland'])('%j → 1891 or later', (text) => {
    expectClue(text, 'england', 1891, null)
    expect(rulesFound(text)).toEqual(['england'])
  })

  it.each(['New England Pottery', 'Made in England', 'Englander'])('%j is not the "England alone" clue', (text) => {
    expect(rulesFound(text)).not.toContain('england')
  })
})

describe('Made in England: about 1921 or later (rule of thumb among collectors: common practice, no published source)', () => {
  it.each(['Made in England', 'MADE IN ENGLAND', 'made in\nEngland'])('%j → 1921 or later, low confidence', (text) => {
    expectClue(text, 'made-in-england', 1921, null)
    expect(clueFor(text, 'made-in-england')?.confidence).toBe('low')
    expect(rulesFound(text)).toEqual(['made-in-england'])
  })

  it.each(['England', 'Made in New England'])('%j is not "Made in England"', (text) => {
    expect(rulesFound(text)).not.toContain('made-in-england')
  })
})

describe('Foreign: 1887 or later, UK market (Merchandise Marks Act 1887; Hansard, 28 Feb 1888)', () => {
  it.each(['Foreign', 'FOREIGN', 'Millbrook Foreign'])('%j → 1887 or later', (text) => {
    expectClue(text, 'foreign', 1887, null)
  })

  it('says it does not meet the US English-country-name rule', () => {
    expect(clueFor('Foreign', 'foreign')?.reason).toMatch(/does not meet the US rule/)
  })

  it.each(['Foreigner', 'Forge'])('%j is not "Foreign"', (text) => {
    expect(rulesFound(text)).toEqual([])
  })
})

describe('Bavaria: a region, no date by itself (from memory)', () => {
  it.each(['Bavaria', 'BAVARIA', 'Millbrook, Bavaria'])('%j is informational only', (text) => {
    expectClue(text, 'bavaria', null, null)
    expectRange(text, null, null)
  })

  it('leaves the date to "Germany" beside it (McKinley Tariff, 1891)', () => {
    expectRange('Millbrook, Bavaria, Germany', 1891, null)
  })

  it('explains a clue without a date in the explanation', () => {
    expect(findDatingClues('Bavaria').explanation).toContain('"Bavaria" gives no date by itself')
  })

  it.each(['Bavarian'])('%j is not "Bavaria"', (text) => {
    expect(rulesFound(text)).toEqual([])
  })
})

describe('® on US goods: 1947 or later (Lanham Act, 15 U.S.C. 1111, in force 5 Jul 1947)', () => {
  it.each(['®', 'Millbrook®', 'MILLBROOK ® DAYTON', '(R)', '( r )'])('%j → 1947 or later', (text) => {
    expectClue(text, 'registered-sign', 1947, null)
  })

  it.each(['©', '™', 'TM', '(RR)', 'R'])('%j is not ®', (text) => {
    expect(rulesFound(text)).not.toContain('registered-sign')
  })
})

describe('Reg. U.S. Pat. Off.: 1905 or later (Trademark Act of 1905, from memory)', () => {
  it.each(['Reg. U.S. Pat. Off.', 'REG US PAT OFF', 'Reg. U. S. Pat. Off.', 'Registered U.S. Patent Office', 'Reg\'d U.S. Pat. Off.'])(
    '%j → 1905 or later',
    (text) => {
      expectClue(text, 'reg-us-pat-off', 1905, null)
    },
  )

  it.each(['U.S. Pat. Pend.', 'Pat. Off.', 'Reg. No. 12345'])('%j is not "Reg. U.S. Pat. Off."', (text) => {
    expect(rulesFound(text)).not.toContain('reg-us-pat-off')
  })
})

describe('Reg. U.S. Pat. & Tm. Off.: 1975 or later (Pub. L. 93-596, in force 2 Jan 1975)', () => {
  it.each(['Reg. U.S. Pat. & Tm. Off.', 'REG. U.S. PAT. & T.M. OFF.', 'Reg US Pat and TM Off', 'Reg. U.S. Pat.&Tm.Off.'])(
    '%j → 1975 or later, superseding the 1905 wording',
    (text) => {
      expectClue(text, 'reg-us-pat-tm-off', 1975, null)
      expect(rulesFound(text)).toEqual(['reg-us-pat-tm-off'])
    },
  )

  it('is not found in the older wording', () => {
    expect(rulesFound('Reg. U.S. Pat. Off.')).not.toContain('reg-us-pat-tm-off')
  })
})

describe('ZIP code: 1963 or later (US Post Office Department, ZIP Code launch 1 Jul 1963)', () => {
  it.each([
    'Dayton, Ohio 45401',
    'Dayton, OH 45401',
    'Dayton OH 45401',
    'ZIP 45401',
    'Springfield, Pa. 15201', // a pre-1963 abbreviation (from memory) still next to a ZIP
  ])('%j → 1963 or later', (text) => {
    expectClue(text, 'zip-code', 1963, null)
  })

  it.each(['Pattern 45401', 'No. 12345', 'Style 45401, Made in Japan', 'Ohio 4540', 'Ohio 454012'])(
    '%j: a five-digit number without a state is not a ZIP',
    (text) => {
      expect(rulesFound(text)).not.toContain('zip-code')
    },
  )
})

describe('ZIP+4: 1983 or later (US Postal Service, ZIP+4 introduced 1983)', () => {
  it.each(['Dayton, OH 45401-1234', 'Dayton, Ohio 45401-1234'])('%j → 1983 or later, superseding the plain ZIP', (text) => {
    expectClue(text, 'zip-plus-4', 1983, null)
    expect(rulesFound(text)).not.toContain('zip-code')
  })

  it('needs a state beside it too', () => {
    expect(rulesFound('Part 45401-1234')).toEqual([])
  })
})

describe('two-letter state code after a town: 1963 or later (USPS Publication 59, 1 Oct 1963)', () => {
  it.each(['Dayton, OH', 'Dayton, OH 45401', 'Millbrook, CA USA', 'dayton, oh', 'Dayton,\nOH'])('%j → 1963 or later', (text) => {
    expectClue(text, 'state-code', 1963, null)
  })

  it.each([
    'Pittsburgh, Pa.', // pre-1963 abbreviation with a dot (from memory)
    'Pittsburgh, Pa', // pre-1963 abbreviation in title case
    'Yes, me too',
    'England, OH dear',
    'Dayton OH', // no comma: too easily an ordinary word
    'Chicago 16, Ill.',
  ])('%j is not a 1963 state code', (text) => {
    expect(rulesFound(text)).not.toContain('state-code')
  })
})

describe('Nebraska codes (USPS state abbreviations history: "NB" 1963–1969, "NE" from 1969)', () => {
  it.each(['Lincoln, NE', 'Lincoln, NE 68501'])('%j → 1969 or later', (text) => {
    expectClue(text, 'state-code-ne', 1969, null)
    expect(rulesFound(text)).not.toContain('state-code')
  })

  it.each(['Lincoln, NB', 'Lincoln, NB 68501'])('%j → 1963–1969', (text) => {
    expectClue(text, 'state-code-nb', 1963, 1969)
  })

  it('is not found in the older "Nebr." abbreviation', () => {
    expect(rulesFound('Omaha, Nebr.')).toEqual([])
  })
})

describe('old postal zone: 1943–1963 (postal zones introduced 1943, replaced by ZIP codes 1963)', () => {
  it.each(['Chicago 16, Ill.', 'New York 10, N.Y.', 'Pittsburgh 13, Pa.', 'Dayton 2, Ohio', 'CHICAGO 16 ILL'])('%j → 1943–1963', (text) => {
    expectClue(text, 'postal-zone', 1943, 1963)
  })

  it('quotes the words as written', () => {
    expect(clueFor('Millbrook Co., Chicago 16, Ill.', 'postal-zone')?.matched).toBe('Chicago 16, Ill')
  })

  it.each(['Chicago, Ill.', 'Chicago 60616, Ill.', 'Pattern 16, Style 4'])('%j is not a postal zone', (text) => {
    expect(rulesFound(text)).not.toContain('postal-zone')
  })
})

describe('UPC barcode: 1973 or later (UPC symbol adopted 1973; first retail scan 26 Jun 1974)', () => {
  // Check digit per the UPC-A algorithm in the GS1 General Specifications (from memory).
  it.each(['0 12345 67890 5', '012345678905', '0-12345-67890-5', 'UPC 0 98765 43210 5'])('%j → 1973 or later', (text) => {
    expectClue(text, 'upc-barcode', 1973, null)
  })

  it.each(['012345678906', '12345678905', '0123456789050'])('%j: a wrong check digit or length is not a UPC', (text) => {
    expect(rulesFound(text)).not.toContain('upc-barcode')
  })
})

describe('microwave wording: 1967 or later (history of the home microwave oven: first countertop model 1967)', () => {
  it.each(['Microwave safe', 'MICROWAVE SAFE', 'Microwave-safe', 'Not microwave safe', 'Microwavable', 'Microwave oven safe'])(
    '%j → 1967 or later',
    (text) => {
      expectClue(text, 'microwave', 1967, null)
      expect(rulesFound(text)).toEqual(['microwave']) // "oven safe" inside it is not a separate clue
    },
  )

  it('says realistically the late 1970s', () => {
    expect(clueFor('Microwave safe', 'microwave')?.reason).toMatch(/late 1970s/)
  })

  it.each(['Micro', 'Wave pattern'])('%j is not microwave wording', (text) => {
    expect(rulesFound(text)).toEqual([])
  })
})

describe('dishwasher wording: about 1950 or later (from memory)', () => {
  it.each(['Dishwasher safe', 'DISHWASHER SAFE', 'Dish-washer safe', 'Dish washer proof'])('%j → 1950 or later, low', (text) => {
    expectClue(text, 'dishwasher', 1950, null)
    expect(clueFor(text, 'dishwasher')?.confidence).toBe('low')
  })

  it.each(['Washer', 'Dish'])('%j is not dishwasher wording', (text) => {
    expect(rulesFound(text)).toEqual([])
  })
})

describe('oven proof: about 1920 or later (from memory)', () => {
  it.each(['Oven proof', 'Ovenproof', 'OVEN-PROOF', 'oven safe'])('%j → 1920 or later, low', (text) => {
    expectClue(text, 'oven-proof', 1920, null)
    expect(clueFor(text, 'oven-proof')?.confidence).toBe('low')
  })

  it.each(['Oven', 'Dutch oven', 'Proof'])('%j is not oven-proof wording', (text) => {
    expect(rulesFound(text)).toEqual([])
  })
})

// ---------- combining clues ----------

describe('combined clues narrow the range (intersection)', () => {
  it('"Made in Japan" + ZIP + ® → 1963 on (secondary sources on 1921; ZIP launch 1963; Lanham Act 1947)', () => {
    const text = 'Millbrook Novelty Co. ® Dayton, OH 45401 Made in Japan'
    expectRange(text, 1963, null)
    expect(rulesFound(text)).toEqual(['registered-sign', 'state-code', 'zip-code', 'japan'])
  })

  it('"Made in Occupied Japan" + ® → 1947–1952 (SCAPIN-1535; Lanham Act)', () => {
    expectRange('Made in Occupied Japan ®', 1947, 1952)
  })

  it('"W. Germany" + ZIP → 1963–1990 (Basic Law 1949, reunification 1990; ZIP launch 1963)', () => {
    expectRange('W. Germany\nImported by Millbrook, Dayton, OH 45401', 1963, 1990)
  })

  it('Czechoslovakia + "Reg. U.S. Pat. & Tm. Off." → 1975–1992 (dissolution 1993; Pub. L. 93-596)', () => {
    expectRange('Made in Czechoslovakia, Reg. U.S. Pat. & Tm. Off.', 1975, 1992)
  })

  it('Yugoslavia + UPC + dishwasher → 1973–2003 (renaming 2003; UPC 1973; dishwasher from memory)', () => {
    expectRange('Jugoslavija\nDishwasher safe\n0 12345 67890 5', 1973, 2003)
  })

  it('"Russia" + ® → 1991 on, one piece of the either-or left (dissolution of the USSR 1991; Lanham Act 1947)', () => {
    const result = findDatingClues('Made in Russia ®')
    expect(result.ranges).toEqual([{ yearFrom: 1991, yearTo: null }])
    expect(result.conflict).toBe(false)
  })

  it('summarises the estimate and every clue in plain words', () => {
    const { explanation } = findDatingClues('Made in Occupied Japan ®')
    expect(explanation).toContain('Probably made 1947–1952')
    expect(explanation).toContain('"Made in Occupied Japan"')
    expect(explanation).toContain('"®"')
  })

  it('says so when nothing dates the piece', () => {
    const result = findDatingClues('Millbrook Pottery, hand decorated')
    expect(result.clues).toEqual([])
    expect(result.range).toEqual({ yearFrom: null, yearTo: null })
    expect(result.conflict).toBe(false)
    expect(result.explanation).toMatch(/No dating clue/)
  })
})

describe('conflicting clues', () => {
  it('"Nippon" + "Microwave safe" conflict (1921 Customs ruling vs first home microwave 1967)', () => {
    const result = findDatingClues('Hand painted Nippon\nMicrowave safe')
    expect(result.conflict).toBe(true)
    expect(result.range).toEqual({ yearFrom: null, yearTo: null })
    expect(result.ranges).toEqual([])
    expect(result.explanation).toContain('"Nippon"')
    expect(result.explanation).toContain('"Microwave safe"')
    expect(result.explanation).toMatch(/reproduction/)
    expect(result.explanation).toMatch(/relabelled/)
    expect(result.explanation).toMatch(/misread/)
  })

  it('Occupied Japan + "Reg. U.S. Pat. & Tm. Off." conflict (Treaty of San Francisco 1952 vs Pub. L. 93-596, 1975)', () => {
    expect(findDatingClues('Made in Occupied Japan, Reg. U.S. Pat. & Tm. Off.').conflict).toBe(true)
  })

  it('old postal zone + ZIP+4 conflict (zones ended 1963; ZIP+4 from 1983)', () => {
    expect(findDatingClues('Chicago 16, Ill.\nDayton, OH 45401-1234').conflict).toBe(true)
  })

  it('"NB" for Nebraska + UPC conflict (NB until 1969; UPC from 1973)', () => {
    expect(findDatingClues('Lincoln, NB\n0 12345 67890 5').conflict).toBe(true)
  })

  it('"Russia" + old postal zone conflict: neither side of the either-or fits 1943–1963', () => {
    const result = findDatingClues('Russia\nChicago 16, Ill.')
    expect(result.conflict).toBe(true)
    expect(result.explanation).toContain('"Russia"')
    expect(result.explanation).toContain('"Chicago 16, Ill"')
  })

  it('explains a conflict no single pair shows (Nippon 1891–1921, Czechoslovakia 1918–1992, Russia either-or)', () => {
    const result = findDatingClues('Nippon, Czechoslovakia, Russia')
    expect(result.conflict).toBe(true)
    expect(result.explanation).toMatch(/Together these clues leave no year/)
  })
})

describe('the optional country field is read as extra text', () => {
  it('dates from the country field alone', () => {
    expectRange('Hand painted', 1891, 1921, 'Nippon')
    expectRange('Millbrook Pottery', 1949, 1990, 'West Germany')
  })

  it('combines with the inscription', () => {
    expectRange('Dayton, OH 45401', 1963, 1990, 'W. Germany')
    expect(findDatingClues('Microwave safe', 'Nippon').conflict).toBe(true)
  })

  it('ignores an empty or missing country', () => {
    expect(findDatingClues('Made in Japan', null)).toEqual(findDatingClues('Made in Japan'))
    expect(findDatingClues('Made in Japan', '   ')).toEqual(findDatingClues('Made in Japan'))
  })
})

// ---------- ISO 3166-3 cross-check ----------

// Debian's iso-codes package. ISO withdrawal dates are not political end dates (the USSR ended on
// 26 Dec 1991, its code was withdrawn on 30 Aug 1992): they only bound our end years from above.
const ISO_3166_3 = '/usr/share/iso-codes/json/iso_3166-3.json'

interface FormerCountry {
  alpha_4: string
  name: string
  withdrawal_date: string
}

function loadFormerCountries(): FormerCountry[] {
  if (!existsSync(ISO_3166_3)) {
    throw new Error(
      `ISO 3166-3 data not found at ${ISO_3166_3}. Install Debian's iso-codes package (apt-get install iso-codes); `
      + 'this cross-check must run, not be skipped.',
    )
  }
  return JSON.parse(readFileSync(ISO_3166_3, 'utf8'))['3166-3']
}

describe('ISO 3166-3 cross-check (Debian iso-codes, iso_3166-3.json)', () => {
  it.each([
    { alpha4: 'CSHH', rule: 'czechoslovakia', politicalEnd: 1992 }, // dissolution 1 Jan 1993
    { alpha4: 'DDDE', rule: 'east-germany', politicalEnd: 1990 }, // reunification 3 Oct 1990
    { alpha4: 'SUHH', rule: 'ussr', politicalEnd: 1991 }, // dissolution 26 Dec 1991
    { alpha4: 'YUCS', rule: 'yugoslavia', politicalEnd: 2003 }, // renaming 4 Feb 2003
  ])('$alpha4 matches rule $rule by name and is withdrawn on or after $politicalEnd', ({ alpha4, rule, politicalEnd }) => {
    const entry = loadFormerCountries().find(country => country.alpha_4 === alpha4)
    expect(entry, `${alpha4} missing from ${ISO_3166_3}`).toBeDefined()

    // ISO's full name and its short form before the first comma both trigger the rule.
    expect(rulesFound(entry!.name)).toContain(rule)
    expect(rulesFound(entry!.name.split(',')[0]!)).toContain(rule)

    const ruleEnd = DATING_RULES.find(r => r.id === rule)!.yearTo
    expect(ruleEnd).toBe(politicalEnd)
    expect(Number(entry!.withdrawal_date.slice(0, 4))).toBeGreaterThanOrEqual(politicalEnd)
  })
})
