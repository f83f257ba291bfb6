export default defineWikiGetHandler('category')
