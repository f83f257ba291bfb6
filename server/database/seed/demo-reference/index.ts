// The invented demo reference for the Hollowbrook Finds team, built deterministically.
import { DEMO_CATEGORIES } from './categories'
import { buildLookalikes } from './lookalikes'
import { buildMakers } from './makers'
import { buildMarks } from './marks'
import type { DemoReference } from './types'

export type {
  DemoCategory,
  DemoDateConfidence,
  DemoLookalike,
  DemoMaker,
  DemoMark,
  DemoMarkType,
  DemoMaterialKey,
  DemoReference,
} from './types'

/** A fresh copy each call; the same content every call. */
export function buildDemoReference(): DemoReference {
  return {
    categories: DEMO_CATEGORIES.map(category => ({ ...category, tags: [...category.tags] })),
    makers: buildMakers(),
    marks: buildMarks(),
    lookalikes: buildLookalikes(),
  }
}
