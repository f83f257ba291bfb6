// A small seeded generator (mulberry32) for the benchmarks: every run builds the same data and asks the same
// things in the same order, so runs compare.
export function seededRandom(seed: number) {
  let state = seed | 0
  const random = (): number => {
    state = (state + 0x6D2B79F5) | 0
    let t = Math.imul(state ^ (state >>> 15), 1 | state)
    t = (t + Math.imul(t ^ (t >>> 7), 61 | t)) ^ t
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296
  }
  const pick = <T>(list: readonly T[]): T => list[Math.floor(random() * list.length)]!
  return { random, pick }
}
