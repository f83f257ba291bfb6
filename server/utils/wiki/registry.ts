// The four entry types the engine knows, by their API type name.
import type { WikiEntryType } from '../../../shared/schemas/wiki'
import { wikiCategoryConfig } from './categories'
import { wikiMakerConfig } from './makers'
import { wikiMarkConfig } from './marks'
import { wikiMaterialConfig } from './materials'
import type { WikiTypeConfig } from './types'

export const wikiConfigs: Record<WikiEntryType, WikiTypeConfig> = {
  mark: wikiMarkConfig,
  maker: wikiMakerConfig,
  material: wikiMaterialConfig,
  category: wikiCategoryConfig,
}
