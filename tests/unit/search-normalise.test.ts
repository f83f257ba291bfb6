// The search normalisation shared by the server index and the phone: folding, German spellings, business
// words, worn-print misreadings, and what a small index finds with the shared options.
import MiniSearch from 'minisearch'
import { describe, expect, it } from 'vitest'
import {
  foldDiacritics, foldMisreadings, plainMarkdown, prefixVariants, runSearch, searchIndexOptions, searchQuery, snippetSegments,
  summariseMatches, predicatesFromMatch, segmentsToHtml, termVariants, tokenize, tokenizeWithOffsets, type SearchDocumentInput,
} from '../../shared/search'

/** True when two written words share a term: then each finds the other. */
const terms = (word: string) => termVariants(tokenize(word)[0] ?? '')
const meet = (a: string, b: string) => terms(a).some(t => terms(b).includes(t))

describe('folding', () => {
  it('drops case, accents and apostrophes and spells out special letters', () => {
    expect(foldDiacritics('Émaillerie Façon')).toBe('emaillerie facon')
    expect(foldDiacritics('Straße')).toBe('strasse')
    expect(foldDiacritics('Søndergård')).toBe('sondergard')
    expect(foldDiacritics('Œuvre')).toBe('oeuvre')
    expect(foldDiacritics('O’Dell')).toBe('odell')
    // Decomposed input (u + combining diaeresis) folds like the composed letter.
    expect(foldDiacritics('Mu\u0308ller')).toBe(foldDiacritics('Müller'))
  })

  it('keeps words whole, & as a word, decomposed accents inside their word', () => {
    expect(tokenizeWithOffsets('Birk & Sons, Co.').map(t => t.text)).toEqual(['Birk', '&', 'Sons', 'Co'])
    expect(tokenizeWithOffsets('Mu\u0308ller O\'Dell')).toEqual([
      { text: 'Mu\u0308ller', start: 0, end: 7 }, { text: 'O\'Dell', start: 8, end: 14 },
    ])
  })
})

describe('German spellings', () => {
  it('lets Müller, Muller and Mueller find each other', () => {
    for (const [a, b] of [['Müller', 'Muller'], ['Müller', 'Mueller'], ['Muller', 'Mueller'], ['MÜLLER', 'mueller']]) {
      expect(meet(a!, b!), `${a} ~ ${b}`).toBe(true)
    }
    expect(meet('Köln', 'Koeln')).toBe(true)
    expect(meet('Gläser', 'Glaeser')).toBe(true)
  })

  it('does not make unrelated words meet', () => {
    expect(meet('Müller', 'Miller')).toBe(false)
    expect(meet('Hall', 'Hull')).toBe(false)
  })
})

describe('business words', () => {
  it('treats & and "and" alike', () => {
    expect(meet('&', 'and')).toBe(true)
    expect(meet('&', 'AND')).toBe(true)
    expect(meet('&', 'or')).toBe(false)
  })

  it('treats Co. and Company alike, and keeps the long word for typing', () => {
    expect(meet('Co', 'Company')).toBe(true)
    expect(meet('CO.', 'company')).toBe(true)
    expect(meet('Mfg', 'Manufacturing')).toBe(true)
    expect(meet('Bros', 'Brothers')).toBe(true)
    expect(termVariants('Company')).toContain('company')
    expect(meet('Co', 'Corp')).toBe(false)
  })
})

describe('misreadings of worn print', () => {
  it.each([
    ['0AKWOOD', 'OAKWOOD'], ['1VORY', 'IVORY'], ['lVORY', 'IVORY'], ['5TONE', 'STONE'], ['8ELL', 'BELL'],
    ['CORNER', 'COMER'], ['CLEAN', 'DEAN'], ['VVEST', 'WEST'], ['HARNESS', 'HAMESS'],
  ])('%s meets %s', (a, b) => {
    expect(meet(a, b)).toBe(true)
  })

  it('folds each group to one spelling', () => {
    expect(foldMisreadings('rn cl vv 0 1 i 5 8')).toBe('m d w o l l s b')
  })

  it('looks ahead for a half-typed rn, cl or vv', () => {
    // "Arnold" is indexed as "amold": typing "ar" must still reach it.
    expect(prefixVariants('ar')).toContain('am')
    expect(prefixVariants('c')).toContain('d')
    expect(prefixVariants('ov')).toContain('ow')
  })

  it('does not fold different letters together', () => {
    expect(meet('BELL', 'BALL')).toBe(false)
    expect(meet('OHIO', 'OHMO')).toBe(false)
  })
})

describe('markdown and snippets', () => {
  it('reads markdown as plain text', () => {
    expect(plainMarkdown('## Seen\nA **green** [backstamp](/t/x/marks/2) in _1950s_ lots')).toBe('Seen\nA green backstamp in 1950s lots')
  })

  it('cuts a snippet around the first match at word boundaries and marks matched words', () => {
    const text = `${'filler words before '.repeat(10)}the HOLLOWAY kiln mark ${'and after it '.repeat(10)}`
    const segments = snippetSegments(text, w => w.toLowerCase() === 'holloway')!
    const joined = segments.map(s => s.text).join('')
    expect(segments.filter(s => s.match).map(s => s.text)).toEqual(['HOLLOWAY'])
    expect(joined.startsWith('…')).toBe(true)
    expect(joined.endsWith('…')).toBe(true)
    expect(joined.length).toBeLessThanOrEqual(142)
    expect(joined).not.toMatch(/…\S*[a-z]…/)
    expect(snippetSegments('nothing here', () => false)).toBeNull()
  })

  it('escapes HTML in the HTML form of a snippet', () => {
    expect(segmentsToHtml([{ text: '<b>', match: false }, { text: 'A&B', match: true }])).toBe('&lt;b&gt;<mark>A&amp;B</mark>')
  })
})

describe('the shared index options', () => {
  const docs: SearchDocumentInput[] = [
    { key: 'mark:1', fields: { inscriptions: 'HOLLOWAY POTTERY CO\nZANESFORD OHIO', title: 'Holloway Pottery' } },
    { key: 'mark:2', fields: { inscriptions: 'Müller & Söhne\nKUNSTKERAMIK', title: 'Müller & Söhne' } },
    { key: 'mark:3', fields: { inscriptions: 'BRANTLEY GLASS WORKS', title: 'Brantley Glass' } },
    { key: 'maker:4', fields: { title: 'Corwin Arnold Company', country: 'England' } },
  ]
  const index = new MiniSearch(searchIndexOptions())
  index.addAll(docs)
  const top = (q: string) => runSearch(index, q)[0]?.id

  it.each([
    ['holloway pottery', 'mark:1'], ['holoway', 'mark:1'], ['HOLL0WAY', 'mark:1'], ['...ERY CO OHIO', 'mark:1'],
    ['mueller und sohne', 'mark:2'], ['muller', 'mark:2'], ['brantl', 'mark:3'], ['brantley glas5', 'mark:3'],
    ['corwin arn', 'maker:4'], ['corwin amold co', 'maker:4'], ['corwin & company', 'maker:4'],
  ])('%s finds %s first', (q, id) => {
    expect(top(q)).toBe(id)
  })

  it('bounds the completions of a half-typed word and still finds the entry the other words point to', () => {
    const many = new MiniSearch(searchIndexOptions())
    // More words starting with "cor" than a query completes: the target's own word is not among the shortest.
    many.addAll(Array.from({ length: 80 }, (_, i) => ({ key: `mark:${i}`, fields: { inscriptions: `COR${'X'.repeat(i % 7)}${i} WARE` } })))
    many.add({ key: 'mark:target', fields: { inscriptions: 'ZANESFORD CORWELLIGAN' } })
    many.add({ key: 'mark:decoy', fields: { inscriptions: 'ZANESFORD BELLWARE' } })
    expect(searchQuery('zanesford cor', many)?.capped).toBe(true)
    const [first, second] = runSearch(many, 'zanesford cor', { fieldsOf: key => key === 'mark:target' ? { inscriptions: 'ZANESFORD CORWELLIGAN' } : { inscriptions: 'ZANESFORD BELLWARE' } })
    expect(first?.id).toBe('mark:target')
    expect(second?.id).toBe('mark:decoy')
    expect(Object.keys(first!.match)).toContain('corwelllgan')
    // A lone prefix is completed to the shortest words only.
    expect(runSearch(many, 'cor').length).toBeLessThanOrEqual(48)
  })

  it('finds nothing for words that are not there', () => {
    expect(runSearch(index, 'zzyzx')).toEqual([])
    expect(searchQuery('  …  ')).toBeNull()
  })

  it('reports the matched words as written in the entry', () => {
    const [hit] = runSearch(index, '...ERY ohio')
    const summary = summariseMatches(docs[0]!.fields, predicatesFromMatch(hit!.match))
    expect(summary.matched.inscriptions).toEqual(['POTTERY', 'OHIO'])
    expect(summary.snippet?.field).toBe('inscriptions')
    expect(summary.snippet?.segments.filter(s => s.match).map(s => s.text)).toEqual(['POTTERY', 'OHIO'])
  })
})

describe('words named like members of every JavaScript object', () => {
  // A note quoting "{{constructor.constructor(...)()}}" once broke the whole team's index: "constructor" was
  // looked up in a plain object of business words and found Object.prototype.constructor.
  it('are ordinary words with string terms', () => {
    for (const word of ['constructor', 'toString', 'valueOf', 'hasOwnProperty', 'isPrototypeOf', 'proto']) {
      const variants = termVariants(word.toLowerCase())
      expect(variants.length, word).toBeGreaterThan(0)
      for (const v of variants) expect(typeof v, word).toBe('string')
    }
  })

  it('are indexed and found, also when a half-typed word is completed to one of them', () => {
    const many = new MiniSearch(searchIndexOptions())
    many.addAll(Array.from({ length: 80 }, (_, i) => ({ key: `mark:${i}`, fields: { inscriptions: `CON${'X'.repeat(i % 7)}${i} WARE` } })))
    const target = { inscriptions: 'ZANESFORD CONSTRUCTOR', body: '{{constructor.constructor(\'x\')()}} toString valueOf' }
    many.add({ key: 'mark:target', fields: target })
    many.add({ key: 'mark:decoy', fields: { inscriptions: 'ZANESFORD BELLWARE' } })
    expect(runSearch(many, 'constructor')[0]?.id).toBe('mark:target')
    expect(runSearch(many, 'tostring')[0]?.id).toBe('mark:target')
    expect(searchQuery('zanesford con', many)?.capped).toBe(true)
    const [first] = runSearch(many, 'zanesford con', { fieldsOf: key => key === 'mark:target' ? target : { inscriptions: 'ZANESFORD BELLWARE' } })
    expect(first?.id).toBe('mark:target')
    expect(first!.match.constructor).toEqual(['inscriptions'])
  })
})
