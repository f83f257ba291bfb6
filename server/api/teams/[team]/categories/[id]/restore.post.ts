export default defineWikiUndeleteHandler('category')
