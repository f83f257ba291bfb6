export default defineWikiPatchHandler('category')
