export default defineWikiNotePatchHandler('category')
