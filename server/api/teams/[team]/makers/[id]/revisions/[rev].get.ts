export default defineWikiRevisionHandler('maker')
