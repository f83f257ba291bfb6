export default defineWikiCreateHandler('category')
