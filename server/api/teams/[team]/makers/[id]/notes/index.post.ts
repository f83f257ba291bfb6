export default defineWikiNoteCreateHandler('maker')
