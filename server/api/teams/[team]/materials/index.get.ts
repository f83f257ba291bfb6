export default defineWikiListHandler('material')
