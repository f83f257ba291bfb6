export default defineWikiNoteDeleteHandler('material')
