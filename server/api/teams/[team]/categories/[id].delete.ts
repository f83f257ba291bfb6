export default defineWikiDeleteHandler('category')
