export default defineWikiRevisionsHandler('mark')
