// The demo team's category tree, with short notes in the team's own voice. Invented scenario:
// Hollowbrook Finds buys at thrift stores and estate sales around the invented town of Hollowbrook.
import type { DemoCategory } from './types'

function category(key: string, name: string, parentKey: string | null, tags: string[], notes: string[]): DemoCategory {
  return { key, name, parentKey, notes: notes.join('\n'), tags }
}

export const DEMO_CATEGORIES: DemoCategory[] = [
  category('pottery', 'Pottery', null, ['ceramics'], [
    'Anything fired from clay. **Turn it over first**: the base tells us more than the front.',
    '',
    '- Check the rim and foot ring for chips with a fingertip, then look for hairlines against the light.',
    '- Crazing is fine on old earthenware; a fresh glued repair is not.',
  ]),
  category('pottery-vases', 'Vases', 'pottery', ['ceramics', 'decor'], [
    'Matte glazes and moulded flowers sell; plain white florist vases do not (we leave them on the shelf).',
    '',
    '- Look inside for a drilled hole: a lamp conversion halves the price.',
  ]),
  category('pottery-planters', 'Planters', 'pottery', ['ceramics', 'garden'], [
    'Figural planters (animals, babies\' shoes, wishing wells) are steady sellers at $12–$30.',
    '',
    '- Mineral rings and soil stains wash out; a chip on the rim does not.',
  ]),
  category('pottery-figurines', 'Figurines', 'pottery', ['ceramics', 'figures'], [
    'Small ceramic figures. Buyers collect by animal or theme, so title listings with the subject first.',
    '',
    '- Fingers, beaks, ears and hat brims break first: check each one.',
    '- A paper label left on the base adds a few dollars.',
  ]),
  category('pottery-dinnerware', 'Dinnerware', 'pottery', ['ceramics', 'tableware'], [
    'Sets sell slowly; serving pieces, gravy boats and lidded dishes sell fast.',
    '',
    '- Knife marks and grey utensil scratches show in photos, so price them down.',
    '- Match the backstamp across the stack: sets get mixed at estate sales.',
  ]),
  category('glass', 'Glass', null, ['glass'], [
    'Pressed, blown and moulded glass. Few pieces are marked, so the shape and the pattern matter more than the base.',
    '',
    '- Run a finger round the rim for flea bites; check for cloudiness that will not wash off ("sick glass").',
  ]),
  category('glass-milk', 'Milk glass', 'glass', ['glass', 'white'], [
    'Opaque white glass. Hobbed and lacy patterns sell; plain florist bowls do not.',
    '',
    '- Hold it to the light: a "fire" of orange or blue at the edge points to an older batch.',
  ]),
  category('glass-uranium', 'Uranium glass', 'glass', ['glass', 'uv'], [
    'Yellow-green glass that glows bright green under the UV torch. Buyers search for "glows", so show it in a photo.',
    '',
    '- Always carry the torch: plenty of green glass does not glow and sells for far less.',
  ]),
  category('glass-pressed', 'Pressed glass', 'glass', ['glass', 'pressed'], [
    'Glass pressed in a mould: compotes, butter dishes, candy dishes. Colour sells better than clear.',
    '',
    '- Mould seams are normal; sharp edges on the seams are a sign of a later reissue.',
  ]),
  category('glass-art', 'Art glass', 'glass', ['glass', 'art'], [
    'Hand-blown and cased glass. Foil labels matter a lot here: photograph them before they fall off.',
    '',
    '- Look for a ground pontil on the base and for bubbles or inclusions that are part of the style.',
  ]),
  category('kitchenware', 'Kitchenware', null, ['kitchen'], [
    'Things people still cook with. Buyers want them clean and usable, so we check lids, handles and rust.',
  ]),
  category('kitchen-bakeware', 'Bakeware', 'kitchenware', ['kitchen', 'oven'], [
    'Casseroles, pie plates, loaf pans. Lids double the price.',
    '',
    '- "Oven proof" or "microwave safe" on the base helps date it; note the wording exactly.',
    '- No cracks at all: bakeware with a hairline goes in the donate box.',
  ]),
  category('kitchen-canisters', 'Canisters', 'kitchenware', ['kitchen', 'storage'], [
    'Sold as sets of three or four. A single canister is worth about a quarter of a set.',
    '',
    '- Check that the lids belong: the lettering and the colour should match across the set.',
  ]),
  category('kitchen-mugs', 'Mugs', 'kitchenware', ['kitchen', 'drinkware'], [
    'Advertising, holiday and speckled stoneware mugs sell; souvenir mugs from theme parks rarely do.',
    '',
    '- Look inside for tea staining and spoon marks.',
  ]),
  category('kitchen-serving', 'Serving', 'kitchenware', ['kitchen', 'tableware'], [
    'Platters, chip-and-dip sets, relish trays, cake stands. Sets in the original box sell well at holidays.',
  ]),
  category('decor', 'Decor', null, ['decor'], [
    'Anything that hangs on a wall or sits on a shelf. Style sells more than age here.',
  ]),
  category('decor-wall', 'Wall decor', 'decor', ['decor', 'wall'], [
    'Plaques, masks, wall pockets. Check the hanger on the back is still there.',
  ]),
  category('decor-candle-holders', 'Candle holders', 'decor', ['decor', 'candles'], [
    'Pairs sell, singles struggle. Scrape old wax gently with a wooden stick, never a knife.',
  ]),
  category('decor-chalkware', 'Chalkware figures', 'decor', ['decor', 'plaster'], [
    'Painted plaster. Light and chalky; flakes if you look at it wrong.',
    '',
    '- Paint loss on the face kills the price. Do not wash it: dust it.',
  ]),
  category('decor-resin', 'Resin figures', 'decor', ['decor', 'resin'], [
    'Cast resin from the late 1970s on. Only named collectible lines with boxes are worth the shelf space.',
    '',
    '- Warm to the touch and light; tap it: it sounds dull, not like porcelain.',
  ]),
  category('decor-carved-wood', 'Carved wood', 'decor', ['decor', 'wood'], [
    'Hand-carved animals and figures. Buyers pay for visible knife marks and old paint.',
    '',
    '- Look for woodworm holes and shrinkage cracks along the grain.',
  ]),
  category('toys', 'Toys', null, ['toys'], [
    'Complete, working and boxed, in that order of importance.',
  ]),
  category('toys-tin', 'Tin toys', 'toys', ['toys', 'metal'], [
    'Lithographed tin. Wind-ups that still run sell at two to three times the price of dead ones.',
    '',
    '- Never force a wind-up key; check tabs for rust and the edges for sharp repairs.',
  ]),
  category('toys-dolls', 'Dolls', 'toys', ['toys', 'dolls'], [
    'Original clothes and hair matter most. Check the back of the neck and between the shoulders for marks.',
  ]),
  category('toys-board-games', 'Board games', 'toys', ['toys', 'games'], [
    'Count the pieces before buying. Box art sells the game; missing pieces cut the price in half.',
    '',
    '- The box bottom or the rules sheet usually carries the maker and the date.',
  ]),
]
