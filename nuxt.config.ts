// https://nuxt.com/docs/api/configuration/nuxt-config
export default defineNuxtConfig({
  compatibilityDate: '2025-07-15',
  modules: ['@pinia/nuxt', '@nuxtjs/tailwindcss', 'nuxt-auth-utils'],
  devtools: { enabled: false },
  telemetry: false,
  css: ['~/assets/css/main.css'],
  app: {
    head: {
      htmlAttrs: { lang: 'en' },
      title: 'Lamina',
      meta: [
        { name: 'viewport', content: 'width=device-width, initial-scale=1' },
        { name: 'description', content: 'Lamina: design, review and hand out short exercise protocols, from screening to the client\'s week plan.' },
        { name: 'theme-color', content: '#1c2a33' },
      ],
      link: [{ rel: 'icon', type: 'image/svg+xml', href: '/favicon.svg' }],
    },
  },
  runtimeConfig: {
    // Read from the environment at run time (NUXT_… variables); see README "Configuration".
    public: { baseUrl: 'http://127.0.0.1:3000' },
  },
  tailwindcss: { cssPath: false, viewer: false },
  // Separate build folders let several checkouts' test runs build side by side (see DEVELOPERS.md).
  buildDir: process.env.LAMINA_NUXT_DIR || '.nuxt',
  nitro: {
    output: { dir: process.env.LAMINA_OUTPUT_DIR || '.output' },
    // The block library ships inside the server build, so .output does not depend on cwd.
    serverAssets: [{ baseName: 'blocks', dir: '../blocks' }],
  },
  typescript: { strict: true },
})
