// The signed-in member as the client sees them: /api/me, plus `can(action)` from the shared
// permission table. It only shows or hides actions; the server decides.
import { defineStore } from 'pinia'
import { can as roleCan, type Action } from '#shared/permissions'

export const useMemberStore = defineStore('member', () => {
  const requestFetch = useRequestFetch()
  const auth = useUserSession()
  const load = () => requestFetch('/api/me')

  const me = ref<Awaited<ReturnType<typeof load>> | null>(null)
  const loaded = ref(false)

  const user = computed(() => me.value?.user ?? null)
  const practice = computed(() => me.value?.practice ?? null)
  const role = computed(() => me.value?.role ?? null)
  const practices = computed(() => me.value?.practices ?? [])
  const signedIn = computed(() => Boolean(me.value))

  /** True when the current role may do `action` (for showing controls, never for deciding). */
  const can = (action: Action) => roleCan(role.value, action)

  /** Reloads /api/me; anonymous callers end up with `me = null`. */
  async function refresh() {
    try {
      me.value = await load()
    }
    catch (error) {
      if ((error as { statusCode?: number }).statusCode !== 401) throw error
      me.value = null
    }
    loaded.value = true
    // Keep nuxt-auth-utils' own view of the session (used by the app shell) in step.
    if (Boolean(auth.user.value) !== Boolean(me.value)) await auth.fetch()
  }

  async function switchPractice(practiceId: string) {
    await requestFetch('/api/me/practice', { method: 'POST', body: { practiceId } })
    await refresh()
  }

  async function signOut() {
    await requestFetch('/api/auth/sign-out', { method: 'POST' })
    me.value = null
    await auth.fetch()
  }

  return { me, loaded, user, practice, role, practices, signedIn, can, refresh, switchPractice, signOut }
})
