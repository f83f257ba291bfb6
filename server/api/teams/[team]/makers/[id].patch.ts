export default defineWikiPatchHandler('maker')
