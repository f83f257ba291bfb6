export default defineWikiNotesListHandler('material')
