export default defineWikiCreateHandler('mark')
