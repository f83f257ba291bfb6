/** After sign-in, registration or accepting an invitation: refresh the session and go to the right team. */
export function useSignedIn() {
  const { fetch: refreshSession } = useUserSession()
  const prefs = usePreferencesStore()
  const route = useRoute()
  return async (teamSlug?: string) => {
    await refreshSession()
    await refreshMe()
    const next = typeof route.query.next === 'string' && route.query.next.startsWith('/') && !route.query.next.startsWith('//') ? route.query.next : null
    if (next) return navigateTo(next)
    const me = await apiFetch<MeResponse>('/api/me')
    const target = teamSlug ?? (me.teams.find(t => t.slug === prefs.lastTeam) ?? me.teams[0])?.slug
    return navigateTo(target ? `/t/${target}` : '/account')
  }
}
