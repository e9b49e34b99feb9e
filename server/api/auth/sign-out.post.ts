// Ends the session on this device. Safe to call when already signed out.
export default defineEventHandler(async (event) => {
  const session = await getUserSession(event)
  if (session.user?.id) {
    await audit(event, { user: session.user, practice: session.practiceId ? { id: session.practiceId } : null }, 'sign_out', { type: 'user', id: session.user.id })
  }
  await clearUserSession(event)
  return { signedOut: true }
})
