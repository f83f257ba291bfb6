// Shapes of the invented demo reference for the Hollowbrook Finds team: categories, makers, marks
// and look-alike pairs. Keys are kebab-case and unique within their list.

export type DemoMarkType
  = | 'printed'
    | 'impressed'
    | 'incised'
    | 'underglaze'
    | 'painted'
    | 'moulded'
    | 'paper_label'
    | 'foil_label'
    | 'other'

export type DemoDateConfidence = 'low' | 'medium' | 'high'

/** Keys of the starter materials (server/database/seed/materials.ts). */
export type DemoMaterialKey
  = | 'resin'
    | 'wood'
    | 'chalkware'
    | 'milk-glass'
    | 'uranium-glass'
    | 'stoneware'
    | 'earthenware'
    | 'porcelain'
    | 'bone-china'
    | 'plastic'
    | 'metal'

export interface DemoCategory {
  key: string
  name: string
  parentKey: string | null
  /** Markdown: what sells, what does not, what to check. */
  notes: string
  tags: string[]
}

export interface DemoMaker {
  key: string
  name: string
  otherNames: string[]
  country: string
  yearFrom: number | null
  yearFromApprox: boolean
  yearTo: number | null
  yearToApprox: boolean
  /** Markdown. */
  notes: string
  tags: string[]
}

export interface DemoMark {
  key: string
  /** null for a mark whose maker the team does not know. */
  makerKey: string | null
  title: string
  /** The wording as read on bases: the full mark first, then worn, partial or abbreviated readings. */
  inscriptions: string[]
  markType: DemoMarkType
  colour: string
  position: string
  yearFrom: number | null
  yearTo: number | null
  dateConfidence: DemoDateConfidence
  country: string
  materialKeys: DemoMaterialKey[]
  categoryKeys: string[]
  tags: string[]
  /** Markdown, in the team's voice. */
  notes: string
}

export interface DemoLookalike {
  markKey: string
  otherMarkKey: string
  /** Markdown. */
  howToTell: string
}

export interface DemoReference {
  categories: DemoCategory[]
  makers: DemoMaker[]
  marks: DemoMark[]
  lookalikes: DemoLookalike[]
}
