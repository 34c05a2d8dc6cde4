// Lint rules: Nuxt's recommended flat config with stylistic rules, plus the project's own.
import { createConfigForNuxt } from '@nuxt/eslint-config/flat'

export default createConfigForNuxt({
  features: { stylistic: true, typescript: { strict: false } },
}).append(
  { ignores: ['.output/**', '.nuxt/**', 'drizzle/**', 'node_modules/**', 'test-results/**', 'data/**'] },
  {
    rules: {
      '@typescript-eslint/no-explicit-any': 'error',
      'no-console': ['warn', { allow: ['warn', 'error', 'log'] }],
      // Short one-line handlers (`() => { log += chunk }`) read better than three lines.
      '@stylistic/max-statements-per-line': 'off',
    },
  },
  {
    files: ['tests/**'],
    rules: { '@typescript-eslint/no-explicit-any': 'off' },
  },
)
