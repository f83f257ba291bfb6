export default defineWikiCreateHandler('maker')
