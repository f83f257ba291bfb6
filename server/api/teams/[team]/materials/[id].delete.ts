export default defineWikiDeleteHandler('material')
