export default defineWikiNoteCreateHandler('material')
