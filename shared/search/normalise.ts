// Search text normalisation, shared by the server's index and (later) the phone's offline index: the same
// text must give the same terms on both sides, or a word found on one would be missed on the other.
//
// A word becomes one or more *terms*. Two words find each other when their term sets meet, so every rule
// below either folds a difference away (case, accents, worn print) or adds a second spelling (Müller → both
// "muller" and "mueller"; "Company" → both "co" and "company").

/** A word of a text with where it stands, so matches can be highlighted in the original. */
export interface TextToken { text: string, start: number, end: number }

// Letters, digits and combining marks (decomposed accents stay with their letter); an apostrophe inside a
// word joins it ("O'Dell" is one word); "&" is a word of its own, because it means "and".
const WORD = /[\p{L}\p{N}\p{M}]+(?:['’][\p{L}\p{N}\p{M}]+)*|&/gu

export function tokenizeWithOffsets(text: string): TextToken[] {
  const out: TextToken[] = []
  for (const m of text.matchAll(WORD)) out.push({ text: m[0], start: m.index, end: m.index + m[0].length })
  return out
}

export function tokenize(text: string): string[] {
  return text.match(WORD) ?? []
}

// Letters NFKD does not take apart.
const SPELLED_OUT: Record<string, string> = { ß: 'ss', æ: 'ae', œ: 'oe', ø: 'o', ł: 'l', đ: 'd', ð: 'd', þ: 'th', ı: 'i' }
const SPELLED_OUT_RE = /[ßæœøłđðþı]/g
const UMLAUT_RE = /[äöü]/g
const UMLAUT: Record<string, string> = { ä: 'ae', ö: 'oe', ü: 'ue' }

/** Lower case, no accents, ligatures spelled out, apostrophes dropped: "Müller's" → "mullers". */
export function foldDiacritics(text: string): string {
  return text.toLowerCase().replace(SPELLED_OUT_RE, c => SPELLED_OUT[c]!)
    .normalize('NFKD').replace(/\p{M}+/gu, '').replace(/['’]/g, '')
}

/** German usage writes an umlaut as a following e: "Müller" → "mueller". */
export function foldGerman(text: string): string {
  return foldDiacritics(text.toLowerCase().normalize('NFC').replace(UMLAUT_RE, c => UMLAUT[c]!))
}

/**
 * Worn or small print is misread in known ways: 0/O, 1/I/l, 5/S, 8/B, rn/m, cl/d, vv/w. Each group folds to
 * one spelling, on indexed and typed words alike, so either reading finds the other. Input is already folded.
 */
export function foldMisreadings(term: string): string {
  return term.replace(/rn/g, 'm').replace(/cl/g, 'd').replace(/vv/g, 'w')
    .replace(/0/g, 'o').replace(/[1i]/g, 'l').replace(/5/g, 's').replace(/8/g, 'b')
}

// Words of business names written long or short; each keeps its own spelling too, so "comp" still finds
// "Company" while typing. Keys and values are folded.
const SAME_WORD: Record<string, string> = {
  and: 'and', und: 'and', et: 'and',
  company: 'co', compagnie: 'co', cie: 'co',
  corporation: 'corp',
  manufacturing: 'mfg', manufactory: 'mfg', manufacturers: 'mfg', manufacturer: 'mfg', mfrs: 'mfg', mfr: 'mfg', mfy: 'mfg',
  brothers: 'bros', bro: 'bros',
  limited: 'ltd',
  incorporated: 'inc',
}

/** The folded spellings of one word (before misreadings are folded). */
function spellings(word: string): string[] {
  if (word === '&') return ['and']
  const plain = foldDiacritics(word)
  if (!plain) return []
  const out = new Set<string>([plain])
  const german = foldGerman(word)
  out.add(german)
  // A written-out umlaut ("Mueller") also stands for the plain letter ("Muller").
  for (const s of [plain, german]) if (/[aou]e/.test(s)) out.add(s.replace(/([aou])e/g, '$1'))
  for (const s of [...out]) {
    // Own keys only: a word like "constructor" or "__proto__" must not pick up Object.prototype's members.
    if (Object.hasOwn(SAME_WORD, s)) out.add(SAME_WORD[s]!)
  }
  return [...out]
}

// The same words come up again and again (in documents, snippets and queries): remember their terms.
const variantCache = new Map<string, string[]>()
const VARIANT_CACHE_SIZE = 50_000

/** The index terms of one word: every spelling, with misreadings folded. */
export function termVariants(word: string): string[] {
  let terms = variantCache.get(word)
  if (!terms) {
    terms = [...new Set(spellings(word).map(foldMisreadings))]
    if (variantCache.size >= VARIANT_CACHE_SIZE) variantCache.clear()
    variantCache.set(word, terms)
  }
  return terms
}

/**
 * Terms of the last word of a query as typed: a word cut after "r", "c" or "v" may be the start of "rn",
 * "cl" or "vv", which the index holds folded ("Arnold" is "amold"): "ar" also looks for "am".
 */
export function prefixVariants(word: string): string[] {
  const out = new Set(termVariants(word))
  for (const s of spellings(word)) {
    const cut = /(r|c|v)$/.exec(s)
    if (cut) out.add(foldMisreadings(s.slice(0, -1)) + ({ r: 'm', c: 'd', v: 'w' } as const)[cut[1] as 'r' | 'c' | 'v'])
  }
  return [...out]
}

/** The spelling terms of a word read backwards, for finding a word from its end ("…ERY" of "POTTERY"). */
export function reversedVariants(word: string): string[] {
  return termVariants(word).map(t => [...t].reverse().join(''))
}

/** Markdown as plain text for indexing and snippets: link targets, emphasis marks and headings dropped. */
export function plainMarkdown(text: string): string {
  return text
    .replace(/!?\[([^\]]*)\]\([^)]*\)/g, '$1')
    .replace(/^\s{0,3}(?:#{1,6}|>|[-*+]|\d+\.)\s+/gm, '')
    .replace(/(\*\*|__|\*|_|`|~~)/g, '')
}
