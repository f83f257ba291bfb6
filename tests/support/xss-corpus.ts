// Classic cross-site scripting payloads, written for our tests from well-known public categories (the
// category is named beside each). When one runs it calls window.__xss('<id>') or alert('<id>'), so a test
// can tell exactly which payload executed. Ids are "xss" and two digits; they are lower case so tags (which
// are lower-cased) keep them, and they stay readable when the payload is shown as text, as it must be.

export interface XssPayload {
  id: string
  category: string
  payload: string
  /** In markdown this is a valid link or image: the payload ends up in its (inert) title or alt attribute, not in the text. */
  attributeInMarkdown?: boolean
}

const S = (id: string) => `__xss('${id}')`

const RAW: [category: string, payload: (id: string) => string, attributeInMarkdown?: true][] = [
  ['OWASP XSS Filter Evasion Cheat Sheet: basic script tag', id => `<script>${S(id)}</script>`],
  ['OWASP XSS Filter Evasion Cheat Sheet: IMG onerror', id => `<img src=x onerror=${S(id)}>`],
  ['SVG onload', id => `<svg onload=${S(id)}>`],
  ['SVG with a script element inside', id => `<svg><script>${S(id)}</script></svg>`],
  ['iframe srcdoc', id => `<iframe srcdoc="<img src=x onerror=alert('${id}')>"></iframe>`],
  ['iframe with a javascript: src', id => `<iframe src="javascript:alert('${id}')"></iframe>`],
  ['data: URL in an HTML link', id => `<a href="data:text/html,<script>alert('${id}')</script>">open</a>`],
  ['data: URL in a markdown link', id => `[open](data:text/html,<script>alert('${id}')</script>)`],
  ['object with a data: URL', id => `<object data="data:text/html,<script>alert('${id}')</script>"></object>`],
  ['javascript: URL in markdown link', id => `[click me](javascript:${S(id)})`],
  ['javascript: URL in a markdown autolink', id => `<javascript:${S(id)}>`],
  ['unicode/whitespace in javascript: scheme (tab entity in markdown)', id => `[tab](java&#x09;script:${S(id)})`],
  ['unicode/whitespace in javascript: scheme (leading space, mixed case)', id => `[case]( JaVaScRiPt:${S(id)})`],
  ['unicode/whitespace in javascript: scheme (control character entity)', id => `[ctl](&#x01;javascript:${S(id)})`],
  ['unicode/whitespace in javascript: scheme (percent-encoded letters)', id => `[pct](%6A%61vascript:${S(id)})`],
  ['<a href="jav&#x09;ascript:..."> (OWASP: embedded encoded tab)', id => `<a href="jav&#x09;ascript:${S(id)}">tab</a>`],
  ['HTML entities obfuscation: decimal entities in an event handler', id => `<img src=x onerror="&#95;&#95;xss&#40;'${id}'&#41;">`],
  ['HTML entities obfuscation: the scheme spelled in entities in markdown', id => `[ent](&#106;&#97;&#118;&#97;&#115;&#99;&#114;&#105;&#112;&#116;&#58;${S(id)})`],
  ['attribute breakout with quotes: double quote then a tag', id => `"><img src=x onerror=${S(id)}>`],
  ['attribute breakout with quotes: single quote and an event handler', id => `' onmouseover='__xss("${id}")' x='`],
  ['attribute breakout with quotes: autofocus onfocus (no click needed)', id => `" autofocus onfocus="${S(id)}" x="`],
  ['template/Vue mustache {{constructor.constructor(...)()}}', id => `{{constructor.constructor('__xss("${id}")')()}}`],
  ['template/Vue 3 mustache through a render helper (client-side template injection)', id => `{{_openBlock.constructor('__xss("${id}")')()}}`],
  ['markdown image with onerror in the alt text', id => `![x" onerror="${S(id)}](/api/teams/tm-xss/photos/999999/thumb)`, true],
  ['markdown image with onerror in the URL', id => `![pic](<x" onerror="${S(id)}>)`],
  ['style expression (old IE CSS expression)', id => `<div style="width:expression(${S(id)})">w</div>`],
  ['style with a javascript: url()', id => `<p style="background:url(javascript:${S(id)})">b</p>`],
  ['<details open ontoggle>', id => `<details open ontoggle=${S(id)}>`],
  ['</textarea><script>', id => `</textarea><script>${S(id)}</script>`],
  ['</title><script> (breaking out of the page title)', id => `</title><script>${S(id)}</script>`],
  ['</script><script> (breaking out of a script block, e.g. serialised state)', id => `</script><script>${S(id)}</script>`],
  ['body onload', id => `<body onload=${S(id)}>`],
  ['input autofocus onfocus', id => `<input autofocus onfocus=${S(id)}>`],
  ['video source onerror', id => `<video><source onerror=${S(id)}></video>`],
  ['meta refresh to a javascript: URL', id => `<meta http-equiv="refresh" content="0;url=javascript:${S(id)}">`],
  ['base href hijack', id => `<base href="javascript:${S(id)}//">`],
  ['form action javascript:', id => `<form action="javascript:${S(id)}"><button>go</button></form>`],
  ['OWASP XSS Filter Evasion Cheat Sheet: extraneous open brackets', id => `<<script>script>${S(id)}<</script>/script>`],
  ['OWASP XSS Filter Evasion Cheat Sheet: nested tag to defeat one-pass stripping', id => `<scr<script>ipt>${S(id)}</scr</script>ipt>`],
  ['OWASP XSS Filter Evasion Cheat Sheet: non-alpha-non-digit separator', id => `<svg/onload=${S(id)}>`],
  ['OWASP XSS Filter Evasion Cheat Sheet: grave accent obfuscation', id => `<img src=x onerror=\`${S(id)}\`>`],
  ['mutation XSS: math/mglyph/style namespace confusion', id => `<math><mtext><table><mglyph><style><img src=x onerror=${S(id)}>`],
  ['mutation XSS: noscript attribute breakout', id => `<noscript><p title="</noscript><img src=x onerror=${S(id)}>">`],
  ['SVG animate setting href to javascript:', id => `<svg><a><animate attributeName=href values=javascript:${S(id)} /><text y=20>tap</text></a></svg>`],
  ['markdown link title breakout', id => `[t](https://example.invalid "x\\" onmouseover=\\"${S(id)}")`, true],
  ['JavaScript unicode escapes in an event handler', id => `<img src=x onerror="\\u005f\\u005fxss('${id}')">`],
  ['javascript: with a percent-encoded colon in markdown', id => `[colon](javascript%3A${S(id)})`],
  ['embed with a javascript: src', id => `<embed src="javascript:${S(id)}">`],
  ['plain HTML link to javascript:', id => `<a href="javascript:${S(id)}">plain</a>`],
  ['custom element with an event handler', id => `<x-tm onclick=${S(id)} tabindex=0>tap</x-tm>`],
  ['polyglot (after the well-known "XSS polyglot" challenge)', id => `jaVasCript:/*-/*\`/*\\\`/*'/*"/**/(/* */oNcliCk=${S(id)} )//</stYle/</titLe/</teXtarEa/</scRipt/--!><sVg/<sVg/oNloAd=${S(id)}//>`],
  ['HTML comment breakout', id => `--><script>${S(id)}</script><!--`],
  ['JavaScript string breakout, single quotes', id => `';${S(id)};//`],
  ['JavaScript string breakout, double quotes', id => `"-__xss("${id}")-"`],
  ['HTML5 named entity &colon; in a javascript: href', id => `<a href="&#x6A;avascript&colon;${S(id)}">named</a>`],
  ['marquee onstart', id => `<marquee onstart=${S(id)}>m</marquee>`],
  ['image map area href javascript:', id => `<map name=m><area shape=rect coords=0,0,9,9 href="javascript:${S(id)}"></map>`],
  ['link rel=import / stylesheet from javascript:', id => `<link rel=stylesheet href="javascript:${S(id)}">`],
]

export const XSS_CORPUS: XssPayload[] = RAW.map(([category, make, attributeInMarkdown], i) => {
  const id = `xss${String(i + 1).padStart(2, '0')}`
  return { id, category, payload: make(id), ...(attributeInMarkdown ? { attributeInMarkdown } : {}) }
})

/** Finds payload ids in text (each id is "xss" and exactly two digits). */
export const XSS_ID = /xss\d\d(?!\d)/g

export function xssIdsIn(text: string): string[] {
  return [...new Set(text.match(XSS_ID) ?? [])].sort()
}

/**
 * Payloads for one field: `count` payloads starting at `offset` (wrapping), skipping those that do not fit.
 * Joined with `separator` they stay within `maxLength`; with `eachMax` instead, each one is at most that long
 * (for list fields, one payload per entry). Spreading offsets across fields makes every payload land somewhere.
 */
export function payloadsFor(offset: number, count: number, maxLength: number, separator = ' ', eachMax = Infinity): XssPayload[] {
  const out: XssPayload[] = []
  let length = 0
  for (let step = 0; step < XSS_CORPUS.length && out.length < count; step++) {
    const p = XSS_CORPUS[(offset + step) % XSS_CORPUS.length]!
    const extra = (out.length ? separator.length : 0) + p.payload.length
    if (length + extra > maxLength || p.payload.length > eachMax) continue
    out.push(p)
    length += extra
  }
  return out
}

export function joinPayloads(list: XssPayload[], separator = ' '): string {
  return list.map(p => p.payload).join(separator)
}

/** The whole corpus as one markdown text, one paragraph per payload. */
export function corpusMarkdown(): string {
  return XSS_CORPUS.map(p => p.payload).join('\n\n')
}
