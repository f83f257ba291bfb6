export default defineWikiListHandler('maker')
