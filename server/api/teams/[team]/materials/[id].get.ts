export default defineWikiGetHandler('material')
