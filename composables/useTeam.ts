import { roleAtLeast, type Role } from '~~/shared/roles'

/** The team in the current route (/t/[team]/...) with the caller's role in it. */
export function useTeam() {
  const route = useRoute()
  const { data: me } = useMe()
  const slug = computed(() => String(route.params.team ?? ''))
  const team = computed(() => me.value?.teams.find(t => t.slug === slug.value) ?? null)
  const role = computed<Role | null>(() => team.value?.role ?? null)
  const can = (minimum: Role) => role.value !== null && roleAtLeast(role.value, minimum)
  const path = (rest = '') => `/t/${slug.value}${rest}`
  return { slug, team, role, can, path }
}
