export default defineWikiNotesListHandler('mark')
