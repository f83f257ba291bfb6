export default defineWikiRevisionHandler('category')
