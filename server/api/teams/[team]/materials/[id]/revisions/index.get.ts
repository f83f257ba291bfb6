export default defineWikiRevisionsHandler('material')
