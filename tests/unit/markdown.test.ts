import { describe, expect, it } from 'vitest'
import { extractWikiLinks, isAllowedHref, renderMarkdown, wikiEntryPath } from '../../shared/markdown'
import { XSS_CORPUS, corpusMarkdown, xssIdsIn } from '../support/xss-corpus'

/** Attribute values as a browser would read them (entities decoded). */
function urlAttributes(html: string): string[] {
  const decode = (v: string) => v
    .replace(/&#x([0-9a-f]+);?/gi, (_, h: string) => String.fromCodePoint(Number.parseInt(h, 16)))
    .replace(/&#(\d+);?/g, (_, d: string) => String.fromCodePoint(Number(d)))
    .replace(/&colon;/gi, ':').replace(/&tab;/gi, '\t').replace(/&newline;/gi, '\n')
    .replace(/&quot;/g, '"').replace(/&lt;/g, '<').replace(/&gt;/g, '>').replace(/&amp;/g, '&')
  return [...html.matchAll(/\s(?:href|src|action|formaction|xlink:href)\s*=\s*"([^"]*)"/gi)].map(m => decode(m[1]!))
}

/** What a browser would run: the scheme after stripping the whitespace and control characters it ignores. */
function scheme(url: string): string {
  // eslint-disable-next-line no-control-regex
  const cleaned = url.replace(/[\u0000-\u0020\u007F-\u009F]/g, '').toLowerCase()
  return /^([a-z][a-z0-9+.-]*):/.exec(cleaned)?.[1] ?? ''
}

/** Every tag in the output, with its attributes, for checks that no active HTML got through. */
function tags(html: string): string[] {
  return [...html.matchAll(/<([a-z][a-z0-9-]*)\b[^>]*>/gi)].map(m => m[0])
}

/** Attribute names of one tag, skipping quoted values (a quoted "onclick=" is text, not an attribute). */
function attributeNames(tag: string): string[] {
  const body = tag.replace(/^<[a-z0-9-]+/i, '').replace(/\/?>$/, '')
  return [...body.matchAll(/\s*([^\s=]+)(?:\s*=\s*(?:"[^"]*"|'[^']*'|[^\s"'>]+))?/g)].map(m => m[1]!.toLowerCase())
}

const ALLOWED_TAGS = new Set(['p', 'a', 'img', 'em', 'strong', 'code', 'pre', 'ul', 'ol', 'li', 'blockquote', 'h1', 'h2', 'h3', 'h4', 'h5', 'h6', 'br', 'hr', 'table', 'thead', 'tbody', 'tr', 'th', 'td', 's'])

function expectInert(html: string) {
  for (const tag of tags(html)) {
    const name = /^<([a-z0-9-]+)/i.exec(tag)![1]!.toLowerCase()
    expect(ALLOWED_TAGS, `unexpected tag ${tag}`).toContain(name)
    for (const attribute of attributeNames(tag)) {
      expect(attribute, `no event-handler attribute in ${tag}`).not.toMatch(/^on/i)
      expect(attribute, `no style attribute in ${tag}`).not.toBe('style')
    }
  }
  for (const url of urlAttributes(html)) {
    expect(['http', 'https', 'mailto', ''], `scheme of ${JSON.stringify(url)}`).toContain(scheme(url))
    // Scheme-less URLs must be app paths: "//host" would leave the app.
    if (!scheme(url)) expect(url.startsWith('/') && !url.startsWith('//'), `relative ${JSON.stringify(url)}`).toBe(true)
  }
}

describe('renderMarkdown: raw HTML stays text', () => {
  const attacks = [
    '<script>alert(1)</script>',
    '<SCRIPT SRC=https://evil.example/x.js></SCRIPT>',
    '<img src=x onerror=alert(1)>',
    '<a href="https://example.com" onclick="alert(1)">hi</a>',
    '<svg onload=alert(1)>',
    '<iframe src="javascript:alert(1)"></iframe>',
    '<div style="background:url(javascript:alert(1))">x</div>',
    '<<script>script>alert(1)<</script>/script>',
    '<details open ontoggle=alert(1)>',
    '```\n<script>alert(1)</script>\n```',
  ]
  for (const src of attacks) {
    it(`escapes ${JSON.stringify(src)}`, () => {
      const html = renderMarkdown(src)
      expect(html).not.toMatch(/<script/i)
      expect(html).not.toMatch(/<(img|svg|iframe|div|details)\b/i)
      expectInert(html)
      // The text is still there for the reader, as text.
      expect(html).toContain('&lt;')
    })
  }
})

describe('renderMarkdown: only http, https, mailto and app paths survive as links', () => {
  const badLinks = [
    '[x](javascript:alert(1))',
    '[x](JaVaScRiPt:alert(1))',
    '[x](javascript&#58;alert(1))',
    '[x](&#106;avascript:alert(1))',
    '[x](&#x6A;avascript:alert(1))',
    '[x](javascript&colon;alert(1))',
    '[x](java\tscript:alert(1))',
    '[x](%6A%61vascript:alert(1))',
    '[x]( javascript:alert(1))',
    '[x](<javascript:alert(1)>)',
    '[x](vbscript:msgbox(1))',
    '[x](data:text/html;base64,PHNjcmlwdD5hbGVydCgxKTwvc2NyaXB0Pg==)',
    '![x](data:image/png;base64,iVBORw0KGgo=)',
    '![x](javascript:alert(1))',
    '[x](file:///etc/passwd)',
    '[x](ftp://files.example/a)',
    '[x](tel:+15550100)',
    '[x](//evil.example/path)',
    '<javascript:alert(1)>',
    '[x][r]\n\n[r]: javascript:alert(1)',
  ]
  for (const src of badLinks) {
    it(`does not link ${JSON.stringify(src)}`, () => {
      const html = renderMarkdown(src)
      expectInert(html)
      // Refused links stay visible as plain text, never as a link or an image.
      expect(tags(html).filter(t => /^<(a|img)\b/i.test(t))).toEqual([])
    })
  }

  it('keeps a quote in a link title inside the title attribute', () => {
    const html = renderMarkdown('[x](https://example.com "t\\" onmouseover=\\"alert(1)")')
    expectInert(html)
    expect(html).toContain('title="t&quot; onmouseover=&quot;alert(1)"')
  })

  it('keeps https links, marked nofollow and opened in a new tab', () => {
    const html = renderMarkdown('See [the guide](https://example.com/guide?a=1&b=2).')
    expect(html).toContain('<a href="https://example.com/guide?a=1&amp;b=2" rel="nofollow noopener noreferrer" target="_blank">the guide</a>')
  })

  it('keeps http and mailto links; mailto does not open a tab', () => {
    const html = renderMarkdown('[old](http://example.org) [write](mailto:team@example.com)')
    expect(html).toContain('<a href="http://example.org" rel="nofollow noopener noreferrer" target="_blank">old</a>')
    expect(html).toContain('<a href="mailto:team@example.com" rel="nofollow noopener noreferrer">write</a>')
  })

  it('keeps app paths as same-tab links', () => {
    const html = renderMarkdown('Compare with [the other mark](/t/hollowbrook/marks/12).')
    expect(html).toContain('<a href="/t/hollowbrook/marks/12" rel="nofollow noopener noreferrer">the other mark</a>')
  })

  it('turns bare https addresses and e-mail addresses into links', () => {
    const html = renderMarkdown('Listing at https://shop.example/item/7 or ask ana@example.com')
    expect(html).toContain('<a href="https://shop.example/item/7" rel="nofollow noopener noreferrer" target="_blank">https://shop.example/item/7</a>')
    expect(html).toContain('<a href="mailto:ana@example.com" rel="nofollow noopener noreferrer">ana@example.com</a>')
  })

  it('keeps ordinary markdown formatting', () => {
    const html = renderMarkdown('**Heavy** for its size\n\n- rings when tapped\n- `365 nm`')
    expect(html).toContain('<strong>Heavy</strong>')
    expect(html).toContain('<li>rings when tapped</li>')
    expect(html).toContain('<code>365 nm</code>')
  })

  it('renders empty input as an empty string', () => {
    expect(renderMarkdown('')).toBe('')
    expect(renderMarkdown(null)).toBe('')
  })
})

describe('renderMarkdown: the browser test\'s XSS corpus (tests/support/xss-corpus.ts)', () => {
  for (const p of XSS_CORPUS) {
    it(`${p.id} ${p.category}: inert, and still readable`, () => {
      const html = renderMarkdown(p.payload)
      expectInert(html)
      // Only the two payloads that are valid markdown links or images keep their id in an attribute.
      const text = html.replace(/<[^>]*>/g, '')
      expect(xssIdsIn(text), 'the id shows as text').toEqual(p.attributeInMarkdown ? [] : [p.id])
    })
  }

  it('renders the whole corpus as one note without any active markup', () => {
    const html = renderMarkdown(corpusMarkdown())
    expectInert(html)
    expect(xssIdsIn(html.replace(/<[^>]*>/g, ''))).toEqual(XSS_CORPUS.filter(p => !p.attributeInMarkdown).map(p => p.id))
  })
})

describe('isAllowedHref', () => {
  it('allows exactly http, https, mailto and single-slash paths', () => {
    for (const ok of ['https://a.example', 'HTTP://a.example', 'mailto:x@y.example', '/t/a/marks/1', '/handbook']) expect(isAllowedHref(ok), ok).toBe(true)
    for (const bad of ['javascript:x', 'data:image/png;base64,AA', '//a.example', 'relative/path', '#top', 'ftp://a', '', 'vbscript:x']) expect(isAllowedHref(bad), bad).toBe(false)
  })
})

describe('extractWikiLinks', () => {
  it('finds links to entries of the same team, inline and by reference, once each', () => {
    const src = [
      `[a](${wikiEntryPath('fern', 'mark', 3)}) and again [a](/t/fern/marks/3/)`,
      '[maker][m] and [glass](/t/fern/materials/5#checks) [kind](/t/fern/categories/8?tab=notes)',
      '',
      '[m]: /t/fern/makers/9',
    ].join('\n')
    expect(extractWikiLinks(src, 'fern')).toEqual([
      { type: 'mark', id: 3 },
      { type: 'maker', id: 9 },
      { type: 'material', id: 5 },
      { type: 'category', id: 8 },
    ])
  })

  it('ignores other teams, unknown kinds, code and non-links', () => {
    const src = '[x](/t/other/marks/3) [y](/t/fern/items/4) `[z](/t/fern/marks/5)` /t/fern/marks/6 [w](https://x.example/t/fern/marks/7)'
    expect(extractWikiLinks(src, 'fern')).toEqual([])
  })
})

describe('renderMarkdown: images only from the team\'s photos', () => {
  it('shows a team photo', () => {
    expect(renderMarkdown('![base](/api/teams/hollowbrook/photos/12/display)')).toContain('<img src="/api/teams/hollowbrook/photos/12/display" alt="base">')
  })

  it.each(['/api/teams/hollowbrook/members', '/t/hollowbrook/marks/1', 'https://elsewhere.example/a.png', '//elsewhere.example/a.png'])('keeps only the words of %s', (src) => {
    const html = renderMarkdown(`![worn base](${src})`)
    expect(html).not.toContain('<img')
    expect(html).toContain('worn base')
  })
})
