export default defineWikiListHandler('category')
