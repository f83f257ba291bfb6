export default defineWikiUndeleteHandler('mark')
