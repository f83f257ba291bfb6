export default defineWikiRestoreRevisionHandler('mark')
