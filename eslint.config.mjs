// @ts-check
import withNuxt from './.nuxt/eslint.config.mjs'

export default withNuxt({
  ignores: ['.output/**', '.nuxt/**', '.tmp/**', 'data/**', 'coverage/**'],
}, {
  // Dense tables and forms read better with attributes on one line; the rest of the stylistic
  // preset stands.
  rules: {
    'vue/max-attributes-per-line': 'off',
    'vue/singleline-html-element-content-newline': 'off',
    'vue/multiline-html-element-content-newline': 'off',
    'vue/html-self-closing': ['warn', { html: { void: 'always', normal: 'always', component: 'always' } }],
  },
}, {
  // Tests read arbitrary JSON bodies; typing every response would add noise, not safety.
  files: ['tests/**'],
  rules: { '@typescript-eslint/no-explicit-any': 'off' },
}, {
  // Numeric kernels update x and y (or re and im) together; one line per pair reads better.
  files: ['shared/**', 'tests/**'],
  rules: { '@stylistic/max-statements-per-line': ['error', { max: 4 }] },
})
