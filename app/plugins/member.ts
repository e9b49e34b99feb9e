// Loads the member store once per page load for a signed-in visitor, so the app shell can
// show their name, role and practices on every page (not only on pages behind the auth middleware).
export default defineNuxtPlugin({
  name: 'member-load',
  async setup() {
    const { loggedIn } = useUserSession()
    const member = useMemberStore()
    if (loggedIn.value && !member.loaded) await member.refresh().catch(() => {})
  },
})
