export default defineWikiRevisionHandler('mark')
