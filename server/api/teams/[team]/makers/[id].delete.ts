export default defineWikiDeleteHandler('maker')
