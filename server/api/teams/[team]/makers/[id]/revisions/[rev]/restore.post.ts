export default defineWikiRestoreRevisionHandler('maker')
