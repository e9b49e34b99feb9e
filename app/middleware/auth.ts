// Pages opt in with definePageMeta({ middleware: 'auth' }): anonymous visitors go to sign-in
// and come back to where they were headed.
export default defineNuxtRouteMiddleware(async (to) => {
  const member = useMemberStore()
  if (!member.loaded || !member.signedIn) await member.refresh()
  if (!member.signedIn) return navigateTo({ path: '/sign-in', query: { next: to.fullPath } })
})
