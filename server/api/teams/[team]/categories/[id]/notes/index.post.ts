export default defineWikiNoteCreateHandler('category')
