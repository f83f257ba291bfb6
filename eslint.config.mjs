// @nuxt/eslint flat config with its stylistic rules instead of a separate formatter.
import withNuxt from './.nuxt/eslint.config.mjs'

export default withNuxt({
  ignores: ['server/database/migrations/**', 'tests/artifacts/**', '.data/**'],
}, {
  rules: {
    'vue/multi-word-component-names': 'off',
    '@typescript-eslint/no-explicit-any': 'off',
    // One-line callbacks such as `() => { done = true }` read better than three lines.
    '@stylistic/max-statements-per-line': ['error', { max: 2 }],
  },
})
