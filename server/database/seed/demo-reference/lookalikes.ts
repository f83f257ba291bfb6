// Look-alikes in the demo reference: pieces made to resemble a better-known (invented) maker's
// pattern, with another country on the base. Each spec yields two marks (built in marks.ts: the
// original's signature mark and the copy's mark) and one look-alike pair.
import type { DemoLookalike, DemoMarkType, DemoMaterialKey } from './types'
import { slug } from './makers'

export interface LookalikeSpec {
  /** Maker key of the original. */
  original: string
  pattern: string
  /** Maker key of the copy, or null when the team does not know who made it. */
  copier: string | null
  /** The country on the copy's base (and in its country field). */
  country: string
  /** The copy's full inscription. */
  text: string
  markType: DemoMarkType
  years: [number, number]
  material: DemoMaterialKey
  /** The copy's categories; the original's mark gets the first. */
  categories: string[]
  howToTell: string
}

export const LOOKALIKE_SPECS: LookalikeSpec[] = [
  {
    original: 'dunmore-pell', pattern: 'Briar Rose', copier: 'fujinami', country: 'Japan',
    text: 'BRIAR ROSE JAPAN', markType: 'paper_label', years: [1952, 1968], material: 'earthenware', categories: ['pottery-vases'],
    howToTell: 'The Ohio vases are heavy, with a dry unglazed foot and the name **impressed** in the clay. The Japanese copies are lighter, glazed right under the base, and the roses are painted over the glaze instead of moulded. A red-and-gold label or a black JAPAN stamp settles it.',
  },
  {
    original: 'hollow-ridge', pattern: 'Cattail Marsh', copier: 'sakurada', country: 'Japan',
    text: 'Cattail Marsh Sakurada Made in Japan', markType: 'paper_label', years: [1955, 1972], material: 'earthenware', categories: ['pottery-planters'],
    howToTell: 'Hollow Ridge cattails stand out in relief and the glaze pools brown in the hollows. The copy has flat, sprayed colour, a white body showing at the chips and three little feet instead of a full foot ring.',
  },
  {
    original: 'merriton', pattern: 'Harvest Wheat', copier: null, country: 'Japan',
    text: 'HARVEST WHEAT HAND PAINTED JAPAN', markType: 'printed', years: [1956, 1975], material: 'porcelain', categories: ['pottery-dinnerware'],
    howToTell: 'Merriton is cream earthenware with a decal: look for the tiny dot screen with a loupe. The Japanese set is thin white porcelain, the wheat is brushed by hand and the gold rim wears off first.',
  },
  {
    original: 'ashcombe-trew', pattern: 'Hedgerow', copier: 'koyama', country: 'Japan',
    text: 'KOYAMA CHINA "HEDGEROW" JAPAN', markType: 'printed', years: [1958, 1976], material: 'porcelain', categories: ['pottery-dinnerware'],
    howToTell: 'The English plates are thick ironstone with a slightly blurred transfer print. The Kōyama ones ring when tapped, light shows through the rim, and the hedgerow border has one fewer bird.',
  },
  {
    original: 'crossmere', pattern: 'Garden Party', copier: 'qinghe', country: 'China',
    text: 'GARDEN PARTY COLLECTION Made in China', markType: 'paper_label', years: [1992, 2010], material: 'resin', categories: ['pottery-figurines', 'decor-resin'],
    howToTell: 'Tap it: the Crossmere lady rings like a cup, the copy thuds. The resin copy is warm to the touch, has a felt pad under the base and no backstamp at all once the sticker is gone.',
  },
  {
    original: 'krausel', pattern: 'Lavastrom', copier: 'dravic', country: 'Yugoslavia',
    text: 'DRAVIĆ JUGOSLAVIJA 312', markType: 'impressed', years: [1968, 1982], material: 'stoneware', categories: ['pottery-vases'],
    howToTell: 'Kräusel lava is thick and crusty and the shape number is impressed with a dash ("614-20"). The Dravić vases have a thinner, glossier drip, a red body and a three-digit number with no dash.',
  },
  {
    original: 'obermuhl', pattern: 'Meadow Piper', copier: 'hoshikawa', country: 'Japan',
    text: 'MEADOW PIPER HOSHIKAWA MADE IN JAPAN', markType: 'printed', years: [1952, 1970], material: 'porcelain', categories: ['pottery-figurines'],
    howToTell: 'The German piper has a hole in the base and crisp fingers; the faces are painted with fine brush lines. The Japanese copy is closed underneath, glossier, and the eyes are two dots.',
  },
  {
    original: 'quarrington', pattern: 'Grapevine Lattice', copier: 'borovje', country: 'Yugoslavia',
    text: 'BOROVJE MADE IN YUGOSLAVIA', markType: 'paper_label', years: [1966, 1985], material: 'milk-glass', categories: ['glass-milk'],
    howToTell: 'Hold it to the light: Quarrington milk glass shows an orange-blue "fire" at the edge, the Borovje copy stays flat white. The copy\'s grapes are smaller and the lattice has seven openings, not eight.',
  },
  {
    original: 'fernhollow', pattern: 'Thistle Column', copier: 'jelinek-vrba', country: 'Czechoslovakia',
    text: 'MADE IN CZECHOSLOVAKIA', markType: 'other', years: [1929, 1938], material: 'uranium-glass', categories: ['glass-uranium'],
    howToTell: 'Both glow under the torch. The Czech copy has a ground, polished base with the country acid-etched in tiny letters; Fernhollow bases are rough from the mould and unmarked.',
  },
  {
    original: 'sjoberga', pattern: 'Nordlys', copier: 'weissental', country: 'West Germany',
    text: 'Weißental Glashütte W. Germany', markType: 'foil_label', years: [1962, 1979], material: 'milk-glass', categories: ['glass-art'],
    howToTell: 'The Swedish vase is signed with a diamond point under the base. The German copy has only a foil label, a lighter weight and a rougher, unpolished pontil.',
  },
  {
    original: 'fiorlago', pattern: 'Lagoon Bands', copier: null, country: 'China',
    text: 'MADE IN CHINA', markType: 'foil_label', years: [1996, 2015], material: 'milk-glass', categories: ['glass-art'],
    howToTell: 'The Italian bands are cased between clear layers, so the surface is perfectly smooth. The copies have bands you can feel with a fingernail and a flat, machine-cut base.',
  },
  {
    original: 'dovermill', pattern: 'Rocket Racer', copier: 'miyanoue', country: 'Japan',
    text: 'MIYANOUE TOY CO. MADE IN JAPAN', markType: 'printed', years: [1953, 1964], material: 'metal', categories: ['toys-tin'],
    howToTell: 'Dovermill racers are wind-ups with a fixed key; the Japanese ones are friction toys that spark. Look at the tabs: the copy\'s litho continues under the tabs, Dovermill\'s does not.',
  },
  {
    original: 'hessling', pattern: 'Autobahn Coupé', copier: 'doubravka', country: 'Czechoslovakia',
    text: 'DOUBRAVKA MADE IN CZECHOSLOVAKIA', markType: 'printed', years: [1958, 1975], material: 'metal', categories: ['toys-tin'],
    howToTell: 'The Hessling coupé has rubber tyres and a steering front axle. The Doubravka copy has tin wheels, a fixed axle and the licence plate left blank.',
  },
  {
    original: 'ashgrove', pattern: 'Tropic Parrot', copier: 'miraflor', country: 'Mexico',
    text: 'TALLERES MIRAFLOR HECHO EN MEXICO', markType: 'painted', years: [1964, 1982], material: 'chalkware', categories: ['decor-chalkware'],
    howToTell: 'The Ashgrove parrot is hollow with a pressed wire hanger. The Mexican one is solid and heavier, painted in brighter colours with a varnish that yellows.',
  },
  {
    original: 'vastlunda', pattern: 'Red Runner', copier: null, country: 'Taiwan',
    text: 'Made in Taiwan', markType: 'paper_label', years: [1970, 1988], material: 'wood', categories: ['decor-carved-wood'],
    howToTell: 'The Swedish horse is carved by hand: facets and knife marks under the paint. The Taiwan copy is turned and sanded smooth, with a printed (not painted) harness.',
  },
  {
    original: 'zarechye', pattern: 'Ice Floe Bear', copier: 'luoshan', country: 'China',
    text: 'LUOSHAN PORCELAIN MADE IN CHINA', markType: 'printed', years: [1993, 2012], material: 'porcelain', categories: ['pottery-figurines'],
    howToTell: 'The Soviet bear is matte white biscuit with a blue-grey wash and a Cyrillic mark. The copy is glossy all over, the ice floe is a separate glued piece and the mark is in English.',
  },
  {
    original: 'pennick', pattern: 'Treasure Trail', copier: null, country: 'Hong Kong',
    text: 'TREASURE TRAIL MADE IN HONG KONG', markType: 'printed', years: [1966, 1984], material: 'plastic', categories: ['toys-board-games'],
    howToTell: 'The Pennick box names the town on the bottom and the pawns are turned wood. The Hong Kong game has plastic pawns, a thinner board and no town on the box.',
  },
]

export function signatureKey(spec: LookalikeSpec): string {
  return `${spec.original}-sig-${slug(spec.pattern)}`
}

export function copyKey(spec: LookalikeSpec): string {
  return `${spec.copier ?? 'unknown'}-copy-${slug(spec.pattern)}`
}

export function buildLookalikes(): DemoLookalike[] {
  return LOOKALIKE_SPECS.map(spec => ({ markKey: signatureKey(spec), otherMarkKey: copyKey(spec), howToTell: spec.howToTell }))
}
