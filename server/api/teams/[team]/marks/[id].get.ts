export default defineWikiGetHandler('mark')
