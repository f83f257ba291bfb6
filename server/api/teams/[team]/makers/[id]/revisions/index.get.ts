export default defineWikiRevisionsHandler('maker')
