export default defineWikiPatchHandler('material')
