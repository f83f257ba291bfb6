export default defineWikiRevisionsHandler('category')
