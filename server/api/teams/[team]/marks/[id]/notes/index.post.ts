export default defineWikiNoteCreateHandler('mark')
