export default defineWikiListHandler('mark')
