export default defineWikiNotePatchHandler('mark')
