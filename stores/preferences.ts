// Client state the server does not own: the last team used and display preferences, kept on the device.
import { defineStore } from 'pinia'

export const usePreferencesStore = defineStore('preferences', () => {
  const lastTeam = useCookie<string | null>('tm-last-team', { default: () => null, sameSite: 'lax', maxAge: 60 * 60 * 24 * 365 })
  const compactLists = useCookie<boolean>('tm-compact', { default: () => false, sameSite: 'lax', maxAge: 60 * 60 * 24 * 365 })

  function rememberTeam(slug: string) {
    if (slug && lastTeam.value !== slug) lastTeam.value = slug
  }
  function forgetTeam(slug: string) {
    if (lastTeam.value === slug) lastTeam.value = null
  }
  return { lastTeam, compactLists, rememberTeam, forgetTeam }
})
