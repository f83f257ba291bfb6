// Starter materials for a new team's reference. Facts come from the team's trade-facts notes; each
// names its source inline ("(source: ...)") and in `sources`. Rules of thumb are marked
// "common practice, no published source"; values that rest on memory are marked "from memory".

export interface StarterMaterialChecks {
  /** How heavy it feels for its size. */
  weight: string
  /** What a gentle tap sounds like. */
  sound: string
  /** Temperature to the touch. */
  touch: string
  /** Mould seams, joins, grain. */
  seams: string
  /** Glow under a UV-A torch. */
  uvGlow: string
  /** Light through a thin part. */
  translucency: string
}

export interface StarterMaterial {
  /** Kebab-case key, unique. */
  key: string
  name: string
  /** Markdown: how to recognise it. */
  recognition: string
  /** Short in-store checks; '' where a check does not apply. */
  checks: StarterMaterialChecks
  /** How damage affects value. */
  damage: string
  /** Markdown; '' if none. Every caution defers to local rules and laboratory testing. */
  cautions: string
  /** Markdown. */
  notes: string
  /** Path of the handbook page, e.g. '/handbook/materials/glass'. */
  handbookPath: string
  sources: string[]
  tags: string[]
}

// Source names, spelled exactly as in the handbook pages.
const COMMON = 'common practice, no published source'
const MEMORY = 'from memory'
const ASTM_C373 = 'ASTM C373'
const WOOD_HANDBOOK = 'USDA Forest Products Laboratory Wood Handbook'
const BS_5416 = 'British Standard BS 5416, from memory'
const IS_6988 = 'Indian Standard IS 6988:2002'
const FDA_2010 = 'US FDA guidance on imported traditional pottery, Nov 2010'
const CFR_109_16 = '21 CFR 109.16'

const DEFER = 'Follow your local rules, and rely on laboratory testing when you need to know.'

const GLAZE_CAUTION = [
  `Old, handmade or imported glazes may leach lead or cadmium (source: ${FDA_2010}).`,
  `Decorative ceramicware not for food use must say so or have a hole through it (source: ${CFR_109_16}).`,
  `Crazed or worn glaze and acidic food raise the risk (source: ${COMMON}).`,
  '',
  '> Vintage, antique, handmade or imported ceramics may leach lead or cadmium. Use them for decoration unless a laboratory test says otherwise.',
  '',
  DEFER,
].join('\n')

const NO_HOT_NEEDLE = [
  `Never use a hot-needle test: it damages the piece and can release fumes (source: ${COMMON}).`,
  DEFER,
].join('\n')

const NO_CHEMICAL_TESTS = [
  `Do not use chemical tests or a hot-needle test: they damage items and can release fumes (source: ${COMMON}).`,
  DEFER,
].join('\n')

export const STARTER_MATERIALS: StarterMaterial[] = [
  {
    key: 'resin',
    name: 'Resin',
    recognition: [
      `Cast resin is often made to look like carved wood or stone. It is denser than most woods, at about 1.1–1.5 g/cm³; stone-filled resin is heavier still (source: ${MEMORY}).`,
      '',
      `- Mould seams along the sides or across the base (source: ${COMMON}).`,
      `- A repeating or painted pattern instead of real grain (source: ${COMMON}).`,
      `- The same colour all the way into a chip (source: ${COMMON}).`,
    ].join('\n'),
    checks: {
      weight: 'Heavy for its size next to a wooden piece of the same size.',
      sound: 'A dull click when tapped, no ring.',
      touch: 'Warm to the touch, like wood.',
      seams: 'Look for a thin mould seam and a repeating pattern instead of grain.',
      uvGlow: '',
      translucency: '',
    },
    damage: `A chipped cast-resin piece is usually passed over: the chip shows the same colour inside and cannot be made good (source: ${COMMON}).`,
    cautions: NO_HOT_NEEDLE,
    notes: `Resin and wood both feel warm, so temperature does not separate them (source: ${COMMON}). Compare weight, seams, grain and chip colour instead.`,
    handbookPath: '/handbook/materials/resin-and-wood',
    sources: [MEMORY, COMMON],
    tags: ['resin', 'cast', 'figurine', 'decor'],
  },
  {
    key: 'wood',
    name: 'Wood',
    recognition: [
      `Most woods are about 0.3–0.9 g/cm³ (source: ${WOOD_HANDBOOK}), lighter than cast resin. A few tropical woods are denser (source: ${MEMORY}).`,
      '',
      `- Real grain that runs through the piece and follows its shape (source: ${COMMON}).`,
      `- Tool marks and end grain on the base (source: ${COMMON}).`,
      `- Pale, raw wood fibres inside a chip (source: ${COMMON}).`,
    ].join('\n'),
    checks: {
      weight: 'Light for its size next to a resin piece of the same size.',
      sound: 'A soft, hollow knock when tapped.',
      touch: 'Warm to the touch, like resin.',
      seams: 'Look for real grain and end grain; glued joins rather than mould seams.',
      uvGlow: '',
      translucency: '',
    },
    damage: `A carved wooden piece can still be worth buying with some damage (source: ${COMMON}).`,
    cautions: NO_HOT_NEEDLE,
    notes: `Resin and wood both feel warm, so temperature does not separate them (source: ${COMMON}).`,
    handbookPath: '/handbook/materials/resin-and-wood',
    sources: [WOOD_HANDBOOK, MEMORY, COMMON],
    tags: ['wood', 'carved', 'decor'],
  },
  {
    key: 'chalkware',
    name: 'Chalkware',
    recognition: [
      `Moulded and painted plaster of Paris or gypsum. Fairground prize figures were common in the first half of the 20th century (source: ${COMMON}).`,
      '',
      `- Painted, often matte surface with no glaze (source: ${COMMON}).`,
      `- Chips show white plaster (source: ${COMMON}).`,
      `- Often hollow, with an open or plugged base (source: ${COMMON}).`,
    ].join('\n'),
    checks: {
      weight: 'Varies: many figures are hollow, with thick walls.',
      sound: 'A dull, flat sound when tapped, no ring.',
      touch: 'Dry and chalky where unpainted; not as cool as glazed ceramic.',
      seams: 'Mould seams may show along the sides.',
      uvGlow: '',
      translucency: '',
    },
    damage: `Water damages chalkware and it chips to white, so chips, flaking paint and water stains show plainly and lower value (source: ${COMMON}).`,
    cautions: '',
    notes: `Do not wash chalkware or wipe it with a wet cloth: water damages it (source: ${COMMON}).`,
    handbookPath: '/handbook/materials/chalkware',
    sources: [COMMON],
    tags: ['chalkware', 'plaster', 'figurine'],
  },
  {
    key: 'milk-glass',
    name: 'Milk glass',
    recognition: [
      `Opaque or translucent glass, white or coloured. Nineteenth-century makers called it opal glass (source: ${COMMON}).`,
      '',
      `- Moulded patterns and mould seams (source: ${COMMON}).`,
      `- Often unmarked, or a small moulded mark near the base (source: ${COMMON}).`,
    ].join('\n'),
    checks: {
      weight: 'Solid and fairly heavy, like other pressed glass.',
      sound: 'A clear ring when tapped gently, unless thick or cracked.',
      touch: 'Cool to the touch.',
      seams: 'Mould seams are common on pressed pieces.',
      uvGlow: 'Not a test for milk glass; note any glow but do not rely on it.',
      translucency: 'Opaque, or a soft glow through thin edges held to the light.',
    },
    damage: `Chips on rims and feet lower value; a crack usually ends its use (source: ${COMMON}).`,
    cautions: '',
    notes: `"Opal glass" is the older name for the same material (source: ${COMMON}).`,
    handbookPath: '/handbook/materials/glass',
    sources: [COMMON],
    tags: ['glass', 'milk-glass', 'kitchenware'],
  },
  {
    key: 'uranium-glass',
    name: 'Uranium glass',
    recognition: [
      `Glows bright green under long-wave UV, UV-A 320–400 nm; 365 nm torches are the usual tool (source: ${COMMON}).`,
      '',
      `- Manganese glass can also glow under 365 nm, so the colour of the glow matters (source: ${COMMON}).`,
      `- Uranium content is usually a trace up to about 2 % (source: ${COMMON}).`,
      `- "Vaseline glass" is the nickname for the yellow-green kind (source: ${COMMON}).`,
    ].join('\n'),
    checks: {
      weight: 'Like other glass of its size.',
      sound: 'A clear ring when tapped gently, unless thick or cracked.',
      touch: 'Cool to the touch.',
      seams: 'Mould seams on pressed pieces.',
      uvGlow: 'Bright, even green under a 365 nm UV-A torch. Manganese glass can glow too: judge the colour.',
      translucency: 'Mostly transparent; opaque kinds exist and glow too.',
    },
    damage: `Chips and cracks lower value, and damaged pieces should not be used for food (source: ${COMMON}).`,
    cautions: [
      `Uranium glass has low radioactivity. Do not grind or drill it, and do not use damaged pieces for food (source: ${COMMON}).`,
      `Do not shine a UV torch into anyone's eyes (source: ${COMMON}).`,
      DEFER,
    ].join('\n'),
    notes: `If the glow is weak or another colour, record "glows under UV" rather than "uranium glass" (source: ${COMMON}). Some standards start the UV-A band at 315 nm (source: ${MEMORY}).`,
    handbookPath: '/handbook/materials/glass',
    sources: [COMMON, MEMORY],
    tags: ['glass', 'uranium-glass', 'uv', 'safety'],
  },
  {
    key: 'stoneware',
    name: 'Stoneware',
    recognition: [
      `Fired at about 1100–1300 °C, with water absorption at most about 3 % (source: ${COMMON}). In the ASTM C373 tile classes that is vitreous, 0.5–3 % (source: ${ASTM_C373}).`,
      '',
      `- Thick, heavy and dense; the body is often grey or buff (source: ${COMMON}).`,
      `- Chips look stony rather than chalky (source: ${COMMON}).`,
    ].join('\n'),
    checks: {
      weight: 'Heavy for its size.',
      sound: 'A short ring when tapped gently; a dull note can mean a crack.',
      touch: 'Cool to the touch where glazed.',
      seams: '',
      uvGlow: '',
      translucency: 'Opaque.',
    },
    damage: `Chips, hairlines and crazing lower value; crazing and stains matter most if someone may eat from the piece (source: ${COMMON}).`,
    cautions: GLAZE_CAUTION,
    notes: `Crazing is a network of fine cracks in a glaze under tension; it can make a food-safe glaze unsafe (source: ${COMMON}).`,
    handbookPath: '/handbook/materials/ceramics',
    sources: [COMMON, ASTM_C373, FDA_2010, CFR_109_16],
    tags: ['ceramic', 'stoneware', 'kitchenware', 'food-safety'],
  },
  {
    key: 'earthenware',
    name: 'Earthenware',
    recognition: [
      `Fired at about 1000–1200 °C and porous, with water absorption above about 5 % (source: ${COMMON}). In the ASTM C373 tile classes that is semi-vitreous (3–7 %) or non-vitreous (> 7 %) (source: ${ASTM_C373}).`,
      '',
      `- The unglazed foot ring looks coarse and is often buff, red or brown (source: ${COMMON}).`,
      `- Chips look dull and chalky (source: ${COMMON}).`,
    ].join('\n'),
    checks: {
      weight: 'Thick and fairly heavy for its size.',
      sound: 'A dull sound when tapped, no ring.',
      touch: 'Cool to the touch where glazed.',
      seams: '',
      uvGlow: '',
      translucency: 'Opaque.',
    },
    damage: `Crazing, stains and chips are common with age and lower value (source: ${COMMON}).`,
    cautions: GLAZE_CAUTION,
    notes: `Crazing is a network of fine cracks in a glaze under tension; it can make a food-safe glaze unsafe (source: ${COMMON}).`,
    handbookPath: '/handbook/materials/ceramics',
    sources: [COMMON, ASTM_C373, FDA_2010, CFR_109_16],
    tags: ['ceramic', 'earthenware', 'pottery', 'food-safety'],
  },
  {
    key: 'porcelain',
    name: 'Porcelain',
    recognition: [
      `Fired at about 1200–1400 °C, with water absorption under 0.5 % (source: ${COMMON}). In the ASTM C373 tile classes that is impervious, ≤ 0.5 % (source: ${ASTM_C373}).`,
      '',
      `- Translucent where thin, and rings when tapped (source: ${COMMON}).`,
      `- The unglazed foot ring looks fine, white and slightly glassy; chips look glassy (source: ${COMMON}).`,
    ].join('\n'),
    checks: {
      weight: 'Dense but thin, so moderate for its size.',
      sound: 'A clear, lasting ring when the rim is tapped with a fingernail.',
      touch: 'Cool to the touch.',
      seams: '',
      uvGlow: '',
      translucency: 'Light shows through thin parts held in front of a light.',
    },
    damage: `Chips, hairlines and worn gilding weigh heavily; adhesive tape can lift worn gilding (source: ${COMMON}).`,
    cautions: GLAZE_CAUTION,
    notes: `A dull note on a piece that should ring can mean a hidden crack (source: ${COMMON}).`,
    handbookPath: '/handbook/materials/ceramics',
    sources: [COMMON, ASTM_C373, FDA_2010, CFR_109_16],
    tags: ['ceramic', 'porcelain', 'tableware', 'food-safety'],
  },
  {
    key: 'bone-china',
    name: 'Bone china',
    recognition: [
      `At least 30 % phosphate from animal bone, by the common definition (source: ${BS_5416}). India's standard requires at least 35 % bone ash (source: ${IS_6988}).`,
      '',
      `- Thin, white, light and very translucent (source: ${COMMON}).`,
      `- Rings clearly when tapped (source: ${COMMON}).`,
    ].join('\n'),
    checks: {
      weight: 'Light for its size.',
      sound: 'A clear, lasting ring when the rim is tapped with a fingernail.',
      touch: 'Cool to the touch.',
      seams: '',
      uvGlow: '',
      translucency: 'Very translucent: a hand behind a cup wall shows as a shadow.',
    },
    damage: `Chips, hairlines and worn gilding weigh heavily; adhesive tape can lift worn gilding (source: ${COMMON}).`,
    cautions: GLAZE_CAUTION,
    notes: `The bone-ash figure under BS 5416 is from memory: confirm it before relying on it (source: ${BS_5416}).`,
    handbookPath: '/handbook/materials/ceramics',
    sources: [BS_5416, IS_6988, COMMON, FDA_2010, CFR_109_16],
    tags: ['ceramic', 'bone-china', 'tableware', 'food-safety'],
  },
  {
    key: 'plastic',
    name: 'Plastic',
    recognition: [
      `Light, warm to the touch and moulded (source: ${COMMON}).`,
      '',
      `- Mould seams, and often small round marks where it was pushed out of the mould (source: ${COMMON}).`,
      `- Usually lighter than resin of the same size (source: ${COMMON}).`,
    ].join('\n'),
    checks: {
      weight: 'Light for its size.',
      sound: 'A light click when tapped, no ring.',
      touch: 'Warm to the touch.',
      seams: 'Mould seams and small round marks from the mould.',
      uvGlow: '',
      translucency: '',
    },
    damage: `Cracks, scratches, fading and warping lower value and cannot be made good (source: ${COMMON}).`,
    cautions: NO_CHEMICAL_TESTS,
    notes: `Use only checks that do no harm: weight, seams and temperature (source: ${COMMON}).`,
    handbookPath: '/handbook/materials/plastic-and-metal',
    sources: [COMMON],
    tags: ['plastic', 'toy', 'kitchenware'],
  },
  {
    key: 'metal',
    name: 'Metal',
    recognition: [
      `Cold to the touch at first; a magnet sticks to ferrous metal, iron and most steel (source: ${COMMON}).`,
      '',
      `- A magnet does not stick to brass, copper, aluminium or pewter, and some stainless steels do not attract it either (source: ${MEMORY}).`,
      `- Plated pieces show a different colour where the plating has worn through (source: ${COMMON}).`,
    ].join('\n'),
    checks: {
      weight: 'Aluminium feels light; brass, bronze and pewter feel heavy for their size.',
      sound: 'A ring or clang when tapped, duller on soft metals.',
      touch: 'Cold to the touch at first, warming in the hand.',
      seams: 'Cast pieces may show mould seams or file marks.',
      uvGlow: '',
      translucency: '',
    },
    damage: `Dents, worn plating and missing parts lower value (source: ${COMMON}).`,
    cautions: [
      `Do not use chemical tests, and do not scratch or file a piece to see what is underneath: they damage items (source: ${COMMON}).`,
      DEFER,
    ].join('\n'),
    notes: `Carry a small magnet: it is the one metal check that does no harm and tells iron and steel apart from other metals (source: ${COMMON}).`,
    handbookPath: '/handbook/materials/plastic-and-metal',
    sources: [COMMON, MEMORY],
    tags: ['metal', 'kitchenware', 'decor'],
  },
]
