// Marks the document once Vue has hydrated, so browser tests (and CSS) know the page is interactive.
export default defineNuxtPlugin((nuxtApp) => {
  nuxtApp.hook('app:suspense:resolve', () => {
    document.documentElement.dataset.hydrated = 'true'
  })
})
