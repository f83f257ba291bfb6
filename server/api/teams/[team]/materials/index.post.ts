export default defineWikiCreateHandler('material')
