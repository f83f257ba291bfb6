export default defineWikiNoteDeleteHandler('maker')
