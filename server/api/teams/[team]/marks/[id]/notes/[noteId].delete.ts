export default defineWikiNoteDeleteHandler('mark')
