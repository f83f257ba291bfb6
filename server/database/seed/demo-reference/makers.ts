// Invented makers for the demo reference, as a compact table. Every name, town and firm here is
// made up for the Hollowbrook Finds scenario; only the countries and US state codes are real.
// A maker's product line decides which categories, materials and mark wordings its marks get.
import type { DemoMaker, DemoMarkType, DemoMaterialKey } from './types'

export type ProductLine
  = | 'art-pottery' | 'dinnerware' | 'bone-china' | 'figurines' | 'milk-glass' | 'uranium-glass'
    | 'pressed-glass' | 'art-glass' | 'kitchen' | 'metalware' | 'bakeware' | 'mugs' | 'chalkware'
    | 'resin' | 'wood' | 'candles' | 'tin-toys' | 'dolls' | 'games' | 'decor'

export interface LineProfile {
  categories: string[]
  materials: DemoMaterialKey[]
  types: DemoMarkType[]
  positions: string[]
  /** Team-voice sentences; {p} and {q} become prices. */
  sells: string[]
}

const BASE = ['base', 'centre of the base', 'inside the foot ring']

export const LINES: Record<ProductLine, LineProfile> = {
  'art-pottery': { categories: ['pottery-vases', 'pottery-planters'], materials: ['earthenware', 'stoneware'], types: ['impressed', 'moulded', 'incised', 'underglaze', 'paper_label'], positions: [...BASE, 'side of the foot'], sells: ['Sold three of these at about {p}; buyers ask about chips on the rim.', 'Planters with this mark go for {p}–{q} when the glaze is clean.', 'Vases move faster than planters: {q} for a good one.'] },
  'dinnerware': { categories: ['pottery-dinnerware', 'kitchen-serving'], materials: ['earthenware', 'stoneware', 'porcelain'], types: ['printed', 'underglaze'], positions: ['back of the plate', 'centre of the base', 'underside of the platter'], sells: ['Dinner plates sit at {p} each; the gravy boat went for {q}.', 'Serving pieces in this pattern sell in a week at about {q}.', 'Sets sell slowly; we split them and list the platter alone for {q}.'] },
  'bone-china': { categories: ['pottery-dinnerware', 'kitchen-mugs', 'pottery-figurines'], materials: ['bone-china'], types: ['printed', 'underglaze', 'painted'], positions: ['base', 'underside of the saucer', 'base of the cup'], sells: ['Cup-and-saucer pairs go for {p}; a chipped saucer halves it.', 'Buyers ask for a photo of the backstamp before they pay {q}.'] },
  'figurines': { categories: ['pottery-figurines'], materials: ['porcelain', 'earthenware'], types: ['printed', 'painted', 'paper_label', 'impressed', 'underglaze'], positions: ['base', 'back of the figure', 'underside of the plinth'], sells: ['Birds and dogs sell at {p}–{q}; check every beak and ear.', 'Sold a pair for {q}; singles sit for months at {p}.'] },
  'milk-glass': { categories: ['glass-milk', 'glass-pressed'], materials: ['milk-glass'], types: ['moulded', 'paper_label', 'foil_label'], positions: ['centre of the base', 'inside the lid', 'underside of the foot'], sells: ['Lidded pieces go for {q}; open bowls sit at {p}.', 'The hobbed pieces sell; plain ones we leave on the shelf.'] },
  'uranium-glass': { categories: ['glass-uranium', 'glass-pressed'], materials: ['uranium-glass'], types: ['moulded', 'paper_label', 'foil_label', 'other'], positions: ['centre of the base', 'underside of the foot', 'inside the rim'], sells: ['Photograph it glowing: that photo sells it at {q}.', 'Sold four at about {p} each; buyers search "glows".'] },
  'pressed-glass': { categories: ['glass-pressed'], materials: ['uranium-glass', 'milk-glass'], types: ['moulded', 'paper_label', 'foil_label'], positions: ['centre of the base', 'underside of the foot'], sells: ['Colour sells: {q} for amber or green, {p} for clear.', 'Compotes go for {p}–{q} with no rim chips.'] },
  'art-glass': { categories: ['glass-art'], materials: ['milk-glass', 'uranium-glass'], types: ['foil_label', 'paper_label', 'incised'], positions: ['base', 'near the pontil', 'side, near the foot'], sells: ['With the foil label it sold for {q}; without, {p}.', 'Buyers pay {q} for the cased pieces; photograph the label first.'] },
  'kitchen': { categories: ['kitchen-canisters', 'kitchen-serving'], materials: ['earthenware', 'stoneware'], types: ['printed', 'impressed', 'underglaze', 'paper_label'], positions: ['base', 'underside of the lid', 'inside the lid'], sells: ['Sold three of these at about {p}; buyers ask for the lid.', 'A full canister set went for {q}; singles fetch {p}.'] },
  'metalware': { categories: ['kitchen-bakeware', 'kitchen-canisters'], materials: ['metal', 'plastic'], types: ['printed', 'impressed', 'paper_label', 'other'], positions: ['base', 'bottom edge', 'inside the lid'], sells: ['Rust on the base cuts the price to {p}; clean ones go for {q}.', 'Bread boxes sell at {q}; loaf pans barely cover the shelf space.'] },
  'bakeware': { categories: ['kitchen-bakeware', 'kitchen-serving'], materials: ['stoneware', 'earthenware'], types: ['impressed', 'printed', 'underglaze'], positions: ['base', 'underside of the lid'], sells: ['Casseroles with the lid go for {q}; without, {p}.', 'Bean pots sell in autumn at about {q}.'] },
  'mugs': { categories: ['kitchen-mugs'], materials: ['stoneware', 'porcelain'], types: ['printed', 'impressed', 'underglaze', 'paper_label'], positions: ['base', 'inside the foot ring'], sells: ['Mugs sit at {p}; a set of four went for {q}.', 'The speckled ones sell within days at {p}.'] },
  'chalkware': { categories: ['decor-chalkware', 'decor-wall'], materials: ['chalkware'], types: ['impressed', 'painted', 'paper_label', 'other'], positions: ['back', 'underside', 'back of the plaque'], sells: ['Good paint, {q}; flaked faces, {p} at best.', 'Parrots and dogs sell; the rest sits at {p}.'] },
  'resin': { categories: ['decor-resin'], materials: ['resin'], types: ['printed', 'paper_label', 'foil_label', 'moulded'], positions: ['base', 'underside sticker', 'back of the base'], sells: ['Only with the box: {q} boxed, {p} loose.', 'Sold a cottage for {q} in December; in July it sat at {p}.'] },
  'wood': { categories: ['decor-carved-wood', 'decor-wall'], materials: ['wood'], types: ['incised', 'painted', 'paper_label', 'other'], positions: ['base', 'back', 'underside'], sells: ['Visible knife marks sell it: {q} for a good one.', 'Painted ones go for {p}–{q}; check the legs for cracks.'] },
  'candles': { categories: ['decor-candle-holders'], materials: ['metal', 'milk-glass', 'wood'], types: ['printed', 'paper_label', 'foil_label', 'moulded', 'other'], positions: ['base', 'underside of the drip pan'], sells: ['Pairs sell at {q}; singles at {p}.', 'Scrape the wax before the photo; sold two pairs at {q}.'] },
  'tin-toys': { categories: ['toys-tin'], materials: ['metal'], types: ['printed', 'other'], positions: ['underside', 'rear bumper', 'side of the body', 'box end flap'], sells: ['Runs: {q}. Does not run: {p}.', 'Sold one with the box for {q}; the box was half the price.'] },
  'dolls': { categories: ['toys-dolls'], materials: ['plastic', 'porcelain'], types: ['moulded', 'impressed', 'paper_label'], positions: ['back of the neck', 'between the shoulders', 'sole of the foot'], sells: ['Original clothes: {q}. Naked: {p}.', 'Buyers ask about the eyes closing before they pay {q}.'] },
  'games': { categories: ['toys-board-games'], materials: ['plastic', 'wood'], types: ['printed'], positions: ['box bottom', 'box lid, inside', 'rules sheet'], sells: ['Complete with the spinner: {q}; missing pieces: {p}.', 'Count the pieces; sold two this year at about {q}.'] },
  'decor': { categories: ['decor-wall', 'decor-chalkware'], materials: ['metal', 'chalkware', 'wood'], types: ['painted', 'paper_label', 'impressed', 'other'], positions: ['back', 'back of the plaque', 'underside'], sells: ['Wall pieces go for {p}–{q}; check the hanger.', 'Sold a pair for {q} to a dealer from the city.'] },
}

export interface MakerRow {
  key: string
  name: string
  otherNames: string[]
  country: string
  from: string
  to: string
  line: ProductLine
  /** US: "Town, ST"; elsewhere the town or ''. */
  place: string
  note: string
}

const US = 'United States'
const EN = 'England'
const JP = 'Japan'
const WG = 'West Germany'
const CS = 'Czechoslovakia'
const IT = 'Italy'
const CN = 'China'
const MX = 'Mexico'
const SE = 'Sweden'
const SU = 'USSR'
const YU = 'Yugoslavia'

function r(key: string, name: string, otherNames: string[], country: string, from: string, to: string, line: ProductLine, place: string, note: string): MakerRow {
  return { key, name, otherNames, country, from, to, line, place, note }
}

export const MAKER_ROWS: MakerRow[] = [
  r('dunmore-pell', 'Dunmore & Pell Pottery Co.', ['Dunmore and Pell Pottery', 'D & P Pottery'], US, '1902', '1968', 'art-pottery', 'Callowmere, OH', 'Matte green and brown art ware, later florist planters. Early pieces are heavy with a dry, unglazed foot.'),
  r('hollow-ridge', 'Hollow Ridge Pottery', ['Hollow Ridge Art Ware'], US, '~1931', '1979', 'art-pottery', 'Hollowbrook, IL', 'Our own town\'s pottery: it turns up at every estate sale, and locals pay more than online buyers.'),
  r('larkhaven', 'Larkhaven Potteries', ['Larkhaven Pottery Co.'], US, '1919', '~1972', 'art-pottery', 'Quillmont, PA', 'Pastel planters and vases, often with a moulded shape number.'),
  r('tillery-forks', 'Tillery Forks Stoneware Co.', ['Tillery Stoneware'], US, '~1888', '1957', 'kitchen', 'Tillery Forks, MN', 'Salt-glazed crocks, bowls and jugs. Heavy grey body; the stamp is often faint.'),
  r('merriton', 'Merriton China Co.', ['Merriton Dinnerware', 'Merriton'], US, '1921', '1985', 'dinnerware', 'Merriton Springs, WV', 'Semi-vitreous dinnerware with decals. Dozens of patterns; the backstamp names most of them.'),
  r('brackenford', 'Brackenford Pottery', ['Brackenford Ware'], US, '1946', '1992', 'dinnerware', 'Brackenford, CA', 'Solid-colour dinnerware; the bright glazes sell, the browns do not.'),
  r('owl-creek', 'Owl Creek Ceramics', ['Owlcreek Ceramics'], US, '1950', '~1975', 'figurines', 'Vantrell, CA', 'Hand-decorated animal figurines and small planters from a family studio.'),
  r('quarrington', 'Quarrington Glass Co.', ['Quarrington Glass Company', 'Q. G. Co.'], US, '1897', '1979', 'milk-glass', 'Quarrington, WV', 'Milk glass and coloured pressed glass; only later pieces carry a moulded mark.'),
  r('fernhollow', 'Fernhollow Glass Works', ['Fern Hollow Glass'], US, '1904', '1958', 'uranium-glass', 'Fernhollow, IN', 'Yellow and green pressed glass, much of it uranium glass. Glows hard under the torch.'),
  r('millbrace', 'Millbrace Housewares Inc.', ['Millbrace'], US, '1948', '1996', 'metalware', 'Millbrace, IL', 'Canister sets, bread boxes and spice racks in painted metal, later plastic.'),
  r('coldwater-bend', 'Coldwater Bend Bakeware', ['Coldwater Bend Pottery'], US, '~1925', '1988', 'bakeware', 'Coldwater Bend, MO', 'Brown-and-cream casseroles and bean pots. The oven wording on the base helps date them.'),
  r('ashgrove', 'Ashgrove Novelty Co.', ['Ashgrove Novelties'], US, '1934', '1962', 'chalkware', 'Ashgrove Junction, IL', 'Carnival and gift-shop chalkware: parrots, dogs, wall plaques.'),
  r('dovermill', 'Dovermill Toy Works', ['Dovermill Toys', 'D. T. W.'], US, '1922', '1971', 'tin-toys', 'Dovermill, PA', 'Wind-up tin cars, trucks and spinning tops.'),
  r('pennick', 'Pennick Game Co.', ['Pennick Games'], US, '1911', '1989', 'games', 'Sallowfield, MA', 'Family board games; the box bottom gives the town and often the year.'),
  r('wrenfield', 'Wrenfield Doll Co.', ['Wrenfield Dolls'], US, '1938', '1978', 'dolls', 'Wrenfield, NY', 'Hard-plastic and vinyl dolls; the mark is moulded on the back of the neck.'),
  r('cobblers-bench', 'Cobbler\'s Bench Woodcraft', ['Cobblers Bench Woodcraft'], US, '1955', '', 'wood', 'Harrow Gap, TN', 'Carved and painted wooden animals and signs. Still carving.'),
  r('glimmer-hask', 'Glimmer & Hask Candle Co.', ['Glimmer and Hask'], US, '1961', '2008', 'candles', 'Tensley, WI', 'Candle holders in brass, milk glass and turned wood, sold through gift shops.'),
  r('thistledown', 'Thistledown Studios', ['Thistledown Collectibles'], US, '1978', '2012', 'resin', 'Bramwell Lake, MN', 'Resin angels, cottages and Santas in numbered series.'),
  r('kettleby', 'Kettleby Stoneware', ['Kettleby Pottery'], US, '1966', '', 'mugs', 'Kettleby, NE', 'Speckled stoneware mugs and bowls from a small studio that is still working.'),
  r('sunward', 'Sunward Pottery', ['Sunward Art Pottery'], US, '1938', '1971', 'art-pottery', 'Dell Vista, CA', 'Bright glossy vases and console bowls, many with a moulded rib pattern.'),
  r('orchard-lane', 'Orchard Lane Ceramics', ['Orchard Lane'], US, '1949', '1983', 'kitchen', 'Greaves Mill, OH', 'Cookie jars, canisters and salt-and-pepper sets with fruit decoration.'),
  r('harlan-voss', 'Harlan & Voss Mfg. Co.', ['Harlan and Voss Manufacturing'], US, '1909', '1966', 'metalware', 'Tensley, WI', 'Pressed-steel and enamelled bakeware: pie tins, loaf pans, cake moulds.'),
  r('ashcombe-trew', 'Ashcombe & Trew Ltd.', ['Ashcombe and Trew', 'A & T'], EN, '1874', '1981', 'dinnerware', 'Tunsley', 'Ironstone and vitreous dinnerware; transfer-printed patterns in blue and brown.'),
  r('pelling', 'Pelling Pottery Ltd.', ['Pelling Ware'], EN, '1908', '1986', 'kitchen', 'Pellingford', 'Kitchen earthenware: mixing bowls, storage jars, teapots.'),
  r('crossmere', 'Crossmere China Ltd.', ['Crossmere Fine Bone China'], EN, '1899', '1997', 'bone-china', 'Longford Bridge', 'Bone china cups, mugs and lady figurines.'),
  r('hatherby', 'Hatherby & Sons', ['Hatherby and Sons', 'Hatherby Pottery'], EN, '~1862', '1964', 'dinnerware', 'Tunsley', 'Old earthenware dinnerware; the earliest pieces name only the town.'),
  r('wexcombe', 'Wexcombe Art Pottery', ['Wexcombe Pottery'], EN, '1920', '1983', 'art-pottery', 'Wexcombe', 'Vases and jugs in streaky glazes, popular with tourists.'),
  r('grindlow', 'Grindlow Tableware', ['Grindlow'], EN, '1952', '1999', 'mugs', 'Grindlow', 'Printed stoneware mugs and breakfast sets; buyers like the 1970s florals.'),
  r('tolland-greaves', 'Tolland & Greaves Ltd.', ['Tolland and Greaves'], EN, '1885', '1959', 'figurines', 'Stavely Cross', 'Earthenware flatback figures and animal groups.'),
  r('bellwether', 'Bellwether Fine Bone China Co.', ['Bellwether China'], EN, '1930', '1989', 'bone-china', 'Longford Bridge', 'Floral bone china: teacups, trinket boxes, flower posies.'),
  r('hoshikawa', 'Hoshikawa Tōki', ['Hoshikawa Toki', 'Hoshikawa Pottery'], JP, '1924', '1978', 'figurines', '', 'Export figurines: dancers, birds, and copies of European porcelain figures.'),
  r('sakurada', 'Sakurada Shōkai', ['Sakurada Shokai', 'Sakurada & Co.'], JP, '1928', '1985', 'art-pottery', '', 'An export trading house: planters, vases and novelties from many small workshops.'),
  r('koyama', 'Kōyama Porcelain', ['Koyama Porcelain', 'Koyama China'], JP, '1935', '1990', 'dinnerware', '', 'Porcelain dinnerware for export; some patterns follow American and English ones closely.'),
  r('miyanoue', 'Miyanoue Toy Co.', ['Miyanoue Tin Toys'], JP, '1947', '1975', 'tin-toys', '', 'Battery and friction tin toys: robots, cars, boats.'),
  r('tsukimura', 'Tsukimura Trading Co.', ['Tsukimura'], JP, '1950', '1989', 'kitchen', '', 'Kitchen novelties: salt-and-pepper shakers, cookie jars, spoon rests.'),
  r('fujinami', 'Fujinami Ceramics', ['Fujinami Toki'], JP, '1948', '1982', 'art-pottery', '', 'Vases and planters, many made to look like American art pottery.'),
  r('aoyagi', 'Aoyagi Shōten', ['Aoyagi Shoten'], JP, '1921', '1970', 'dolls', '', 'Bisque and celluloid dolls; the small ones were dime-store stock.'),
  r('ishizue', 'Ishizue Porcelain Works', ['Ishizue China'], JP, '1952', '1995', 'mugs', '', 'Porcelain mugs and tea sets with gold trim.'),
  r('krausel', 'Kräusel Keramik', ['Krausel Keramik', 'Kraeusel Keramik'], WG, '1946', '1989', 'art-pottery', '', 'Thick lava glazes on vases and jugs; the shape number is impressed on the base.'),
  r('obermuhl', 'Obermühl Porzellan', ['Obermuhl Porzellan', 'Obermuehl Porzellan', 'Obermühl Porcelain'], WG, '1950', '1990', 'figurines', '', 'Porcelain children and animal figurines, finely painted.'),
  r('brunnhuber', 'Brunnhuber & Söhne', ['Brunnhuber & Sohne', 'Brunnhuber und Soehne'], WG, '1921', '1988', 'wood', '', 'Carved wooden figures, soldier nutcrackers and wall plaques.'),
  r('weissental', 'Weißental Glashütte', ['Weissental Glashutte', 'Weissental Glass'], WG, '1952', '1990', 'art-glass', '', 'Cased and bubbled art glass; vases carry a foil label.'),
  r('hessling', 'Hessling Blechspielwaren', ['Heßling Blechspielwaren', 'Hessling Tin Toys'], WG, '1949', '1979', 'tin-toys', '', 'Clockwork cars and motorcycles in bright lithographed tin.'),
  r('eichler-voigt', 'Eichler & Voigt KG', ['Eichler und Voigt'], WG, '1955', '1990', 'candles', '', 'Candle holders, candle arches and table decorations.'),
  r('skalny', 'Skalný Sklárna', ['Skalny Sklarna', 'Skalny Glassworks'], CS, '1921', '1992', 'uranium-glass', '', 'Uranium and coloured glass: perfume bottles, bowls, vases.'),
  r('horava', 'Hořava Keramika', ['Horava Keramika', 'Horava Pottery'], CS, '1924', '1990', 'art-pottery', '', 'Bright, peasant-style painted vases and pitchers.'),
  r('brezina', 'Březina Porcelán', ['Brezina Porcelan', 'Brezina Porcelain'], CS, '1919', '1991', 'figurines', '', 'Porcelain figurines and small dishes; the green backstamp is the one we see most.'),
  r('doubravka', 'Doubravka Hračky', ['Doubravka Hracky', 'Doubravka Toys'], CS, '1950', '1991', 'tin-toys', '', 'Tin cars, trams and tractors, often with a key.'),
  r('jelinek-vrba', 'Jelínek & Vrba', ['Jelinek & Vrba', 'Jelinek a Vrba'], CS, '1928', '1990', 'pressed-glass', '', 'Pressed glass bowls and vases, some in uranium glass.'),
  r('valdorso', 'Ceramiche Valdorso', ['Valdorso'], IT, '1951', '1994', 'art-pottery', '', 'Tall glossy vases and decanters in bold colours.'),
  r('fiorlago', 'Vetreria Fiorlago', ['Fiorlago Glass'], IT, '1948', '1999', 'art-glass', '', 'Cased art glass with a white inner layer; foil labels in gold.'),
  r('castelmoro', 'Castelmoro Sculture', ['Castelmoro'], IT, '1975', '2010', 'resin', '', 'Resin figures made to look like carved marble: clowns, saints, sleeping children.'),
  r('ginestra', 'Terrecotte Ginestra', ['Ginestra'], IT, '1958', '1990', 'art-pottery', '', 'Terracotta planters with a thin painted glaze.'),
  r('luoshan', 'Luoshan Ceramics Factory', ['Luoshan Ceramic'], CN, '1974', '', 'mugs', '', 'Mugs and gift figurines for export; still making them.'),
  r('qinghe', 'Qinghe Resin Arts Co.', ['Qinghe Arts & Crafts'], CN, '1988', '', 'resin', '', 'Resin figurines, often made to look like older porcelain.'),
  r('tianmei', 'Tianmei Toys Co.', ['Tianmei Toy Factory'], CN, '1979', '2012', 'dolls', '', 'Vinyl fashion dolls and doll furniture.'),
  r('los-sauces', 'Alfarería Los Sauces', ['Alfareria Los Sauces', 'Los Sauces Pottery'], MX, '1948', '1998', 'art-pottery', '', 'Burnished and painted earthenware made for tourists.'),
  r('tlalcuan', 'Vidrios Tlalcuán', ['Vidrios Tlalcuan'], MX, '1955', '2005', 'art-glass', '', 'Bubbly hand-blown glass with a cobalt rim.'),
  r('miraflor', 'Talleres Miraflor', ['Miraflor'], MX, '1960', '1995', 'decor', '', 'Painted plaster and tin wall decor: suns, parrots, mirrors.'),
  r('sjoberga', 'Sjöberga Glasbruk', ['Sjoberga Glasbruk', 'Sjoeberga Glasbruk'], SE, '1898', '1989', 'art-glass', '', 'Heavy clear and cased glass, signed on the base.'),
  r('odegard', 'Ödegård Keramik', ['Odegard Keramik', 'Oedegaard Keramik'], SE, '1932', '1979', 'art-pottery', '', 'Stoneware vases in brown and blue glazes, painted signature on the base.'),
  r('vastlunda', 'Västlunda Trähantverk', ['Vastlunda Trahantverk', 'Vastlunda Woodcraft'], SE, '1946', '1996', 'wood', '', 'Carved and painted wooden horses and birds.'),
  r('zarechye', 'Zarechye Porcelain Factory', ['Zarechensky Farforovy Zavod', 'ZFZ'], SU, '1924', '1991', 'figurines', '', 'Porcelain animal figurines: polar bears, seals, dogs.'),
  r('krasnoles', 'Krasnoles Toy Factory', ['Krasnolesskaya Fabrika Igrushek'], SU, '1932', '1991', 'tin-toys', '', 'Tin and plastic toys; the boxes are printed in Cyrillic.'),
  r('lyubimets', 'Lyubimets Glassworks', ['Lyubimetsky Stekolny Zavod'], SU, '1948', '1991', 'pressed-glass', '', 'Pressed glass bowls and vases in heavy, sharp patterns.'),
  r('dravic', 'Keramika Dravić', ['Keramika Dravic'], YU, '1951', '1991', 'art-pottery', '', 'Glossy vases and pitchers; some follow German lava-glaze styles.'),
  r('borovje', 'Staklo Borovje', ['Borovje Glass'], YU, '1956', '1990', 'milk-glass', '', 'Pressed and milk glass for export.'),
]

function year(text: string): { year: number | null, approx: boolean } {
  if (!text) return { year: null, approx: false }
  return { year: Number(text.replace('~', '')), approx: text.startsWith('~') }
}

export function slug(text: string): string {
  return text.toLowerCase().normalize('NFD').replace(/\p{M}/gu, '').replace(/[^a-z0-9]+/g, '-').replace(/^-|-$/g, '')
}

export function buildMakers(): DemoMaker[] {
  return MAKER_ROWS.map((row) => {
    const from = year(row.from)
    const to = year(row.to)
    const where = row.place ? `${row.place}, ${row.country}` : row.country
    return {
      key: row.key,
      name: row.name,
      otherNames: [...row.otherNames],
      country: row.country,
      yearFrom: from.year,
      yearFromApprox: from.approx,
      yearTo: to.year,
      yearToApprox: to.approx,
      notes: `${row.note}\n\nBased in ${where}.`,
      tags: [row.line, slug(row.country)],
    }
  })
}
