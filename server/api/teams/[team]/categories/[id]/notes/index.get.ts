export default defineWikiNotesListHandler('category')
