export default defineWikiNotesListHandler('maker')
