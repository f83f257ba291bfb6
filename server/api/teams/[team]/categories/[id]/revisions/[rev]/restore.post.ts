export default defineWikiRestoreRevisionHandler('category')
