// Public API of the dating-clue engine: pure TypeScript, usable by both client and server.
export { findDatingClues } from './engine'
export type { DatingClue, DatingResult } from './engine'
export { DATING_RULES } from './rules'
export type { Confidence, DatingRule, Matcher, YearRange } from './rules'
export { containsCyrillic, normaliseInscription, originalSlice } from './normalise'
export type { NormalisedText, TextSpan } from './normalise'
