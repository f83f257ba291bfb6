export default defineWikiPatchHandler('mark')
