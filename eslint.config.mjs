// @ts-check
import withNuxt from './.nuxt/eslint.config.mjs'

export default withNuxt(
  {
    ignores: ['.data/**', '.output/**', 'test-results/**'],
  },
  {
    // Test clients read untyped JSON bodies; `any` there is honest.
    files: ['tests/**'],
    rules: { '@typescript-eslint/no-explicit-any': 'off' },
  },
)
