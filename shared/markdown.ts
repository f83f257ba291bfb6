// Markdown for entry notes, rendered the same on the server and in the browser.
// Safe by construction: raw HTML is escaped (html: false) and only a short list of link kinds survives,
// so pasted <script>, on* attributes and javascript:/data:/vbscript: links (entity-encoded or not) stay inert.
import markdownIt, { type MarkdownIt, type Token } from 'markdown-it'
import { WIKI_ENTRY_TYPES, WIKI_PATH_SEGMENTS, type WikiEntryType } from './schemas/wiki'

/**
 * Checked after markdown-it has decoded entities and percent-encoded the URL, so encoded tricks
 * arrive here spelled out. Only http(s), mailto and app paths pass; a leading "//" would leave the app.
 */
export function isAllowedHref(url: string): boolean {
  const href = url.trim().toLowerCase()
  if (href.startsWith('http://') || href.startsWith('https://') || href.startsWith('mailto:')) return true
  return href.startsWith('/') && !href.startsWith('//')
}

/** A photo served by the app for a team: /api/teams/<team>/photos/<id>/<size>. */
export function isPhotoSrc(src: string): boolean {
  return /^\/api\/teams\/[a-z0-9-]+\/photos\/\d+\/[a-z]+$/.test(src)
}

function isExternal(href: string): boolean {
  return /^https?:\/\//i.test(href)
}

let parser: MarkdownIt | undefined

function markdown(): MarkdownIt {
  if (parser) return parser
  const md = markdownIt({ html: false, linkify: true, breaks: true, typographer: false })
  md.validateLink = isAllowedHref
  const renderLinkOpen = md.renderer.rules.link_open ?? ((tokens, idx, options, _env, self) => self.renderToken(tokens, idx, options))
  md.renderer.rules.link_open = (tokens, idx, options, env, self) => {
    const token = tokens[idx]!
    const href = String(token.attrGet('href') ?? '')
    // Notes are written by team members but may quote anything: no referrer, no ranking credit, no opener.
    token.attrSet('rel', 'nofollow noopener noreferrer')
    if (isExternal(href)) token.attrSet('target', '_blank')
    return renderLinkOpen(tokens, idx, options, env, self)
  }
  // Images only from the team's own photos: any other app path would make every reader's browser request it.
  const renderImage = md.renderer.rules.image ?? ((tokens, idx, options, _env, self) => self.renderToken(tokens, idx, options))
  md.renderer.rules.image = (tokens, idx, options, env, self) => {
    const token = tokens[idx]!
    if (isPhotoSrc(String(token.attrGet('src') ?? ''))) return renderImage(tokens, idx, options, env, self)
    return md.utils.escapeHtml(token.content)
  }
  parser = md
  return md
}

/** Renders markdown source to HTML that is safe to insert as is. */
export function renderMarkdown(src: string | null | undefined): string {
  if (!src) return ''
  return markdown().render(src)
}

/** The app path of an entry page, as written in markdown links between entries. */
export function wikiEntryPath(teamSlug: string, type: WikiEntryType, id: number): string {
  return `/t/${teamSlug}/${WIKI_PATH_SEGMENTS[type]}/${id}`
}

export interface WikiLinkTarget { type: WikiEntryType, id: number }

const TYPE_BY_SEGMENT = new Map(WIKI_ENTRY_TYPES.map(t => [WIKI_PATH_SEGMENTS[t], t]))

/**
 * Entries a markdown text links to: hrefs of the form /t/<teamSlug>/<marks|makers|materials|categories>/<id>
 * (with an optional trailing slash, query or fragment). Uses the parser, so reference-style links count too
 * and links inside code do not.
 */
export function extractWikiLinks(src: string | null | undefined, teamSlug: string): WikiLinkTarget[] {
  if (!src) return []
  const found = new Map<string, WikiLinkTarget>()
  const pattern = /^\/t\/([a-z0-9-]+)\/([a-z]+)\/(\d{1,15})\/?(?:[?#].*)?$/
  const visit = (tokens: Token[]) => {
    for (const token of tokens) {
      if (token.children) visit(token.children)
      if (token.type !== 'link_open') continue
      const match = pattern.exec(String(token.attrGet('href') ?? ''))
      if (!match || match[1] !== teamSlug) continue
      const type = TYPE_BY_SEGMENT.get(match[2]!)
      const id = Number(match[3])
      if (type && Number.isSafeInteger(id) && id > 0) found.set(`${type}:${id}`, { type, id })
    }
  }
  visit(markdown().parse(src, {}))
  return [...found.values()]
}
