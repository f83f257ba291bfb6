export default defineWikiNotePatchHandler('maker')
