export default defineWikiGetHandler('maker')
