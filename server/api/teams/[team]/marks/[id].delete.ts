export default defineWikiDeleteHandler('mark')
