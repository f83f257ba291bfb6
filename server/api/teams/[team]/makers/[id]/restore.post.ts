export default defineWikiUndeleteHandler('maker')
