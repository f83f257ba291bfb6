export default defineWikiNoteDeleteHandler('category')
