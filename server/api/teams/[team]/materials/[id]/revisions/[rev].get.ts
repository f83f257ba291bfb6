export default defineWikiRevisionHandler('material')
