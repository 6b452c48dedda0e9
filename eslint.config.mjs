// @ts-check
import withNuxt from './.nuxt/eslint.config.mjs'

export default withNuxt(
  {
    ignores: ['.data/**', '.output/**', 'test-results/**'],
  },
  {
    // The stylistic rules (nuxt.config.ts: eslint.config.stylistic), with the house's own
    // choices: short templates keep their attributes on one line, a one-line type literal
    // separates members with "; ", and no line is longer than 160 characters.
    rules: {
      '@stylistic/max-len': ['error', { code: 160, ignoreUrls: true, ignoreRegExpLiterals: true, ignoreStrings: true, ignoreTemplateLiterals: true }],
      '@stylistic/member-delimiter-style': ['error', { multiline: { delimiter: 'none' }, singleline: { delimiter: 'semi', requireLast: false } }],
      '@stylistic/max-statements-per-line': ['error', { max: 5 }],
      'vue/max-attributes-per-line': 'off',
      'vue/singleline-html-element-content-newline': 'off',
      'vue/multiline-html-element-content-newline': 'off',
    },
  },
  {
    // Test clients read untyped JSON bodies; `any` there is honest.
    files: ['tests/**'],
    rules: { '@typescript-eslint/no-explicit-any': 'off' },
  },
)
