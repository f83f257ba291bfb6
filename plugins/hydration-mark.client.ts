// Marks the document when Vue has hydrated and when each page has finished loading its data,
// so browser tests know the page is interactive (and which page it is).
export default defineNuxtPlugin((nuxtApp) => {
  const root = document.documentElement
  nuxtApp.hook('app:suspense:resolve', () => {
    root.dataset.hydrated = 'true'
    root.dataset.ready = location.pathname
  })
  nuxtApp.hook('page:start', () => {
    delete root.dataset.ready
  })
  nuxtApp.hook('page:finish', () => {
    root.dataset.ready = location.pathname
  })
})
