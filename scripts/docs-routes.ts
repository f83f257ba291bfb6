// npm run docs:routes — rewrites the API table in README.md from the route files.
import { readFileSync, writeFileSync } from 'node:fs'
import { routesMarkdown } from './lib/routes'

const START = '<!-- routes:start -->'
const END = '<!-- routes:end -->'
const readme = readFileSync('README.md', 'utf8')
const start = readme.indexOf(START)
const end = readme.indexOf(END)
if (start < 0 || end < start) throw new Error('README.md has no routes block')
writeFileSync('README.md', `${readme.slice(0, start + START.length)}\n${routesMarkdown()}\n${readme.slice(end)}`)
console.log('README.md routes table updated.')
