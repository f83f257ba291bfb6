export default defineWikiUndeleteHandler('material')
