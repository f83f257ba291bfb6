export default defineWikiRestoreRevisionHandler('material')
