export default defineWikiNotePatchHandler('material')
