// @nuxt/eslint's flat config, generated into .nuxt by `nuxt prepare`.
import withNuxt from './.nuxt/eslint.config.mjs'

export default withNuxt({
  ignores: ['.data/**', '.output/**'],
})
