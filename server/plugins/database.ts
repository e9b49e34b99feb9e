// Closes the connection pool when the server shuts down, so Ctrl-C ends cleanly.
export default defineNitroPlugin((nitroApp) => {
  nitroApp.hooks.hook('close', () => closeDb())
})
