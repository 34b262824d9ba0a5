// @ts-check
// npm run lint: Nuxt's own ESLint setup (@nuxt/eslint writes .nuxt/eslint.config.mjs at
// `nuxt prepare`; its style options are in nuxt.config.ts) plus the project's conventions from
// DEVELOPERS.md: single quotes, no semicolons, <NuxtLink> (or <RouterLink>) for links.
import withNuxt from './.nuxt/eslint.config.mjs'

export default withNuxt(
  {
    ignores: ['.data/**', '.output/**', '.output-build/**', 'drizzle/**', 'public/**', 'test-results/**', 'playwright-report/**'],
  },
  {
    rules: {
      // Links go through <NuxtLink> (prefetch, client navigation, `external` for the rest), or
      // vue-router's <RouterLink> in the shell and on the Run screen, where NuxtLink's own script
      // is not worth loading (components/layout/TheTopBar.vue); a download link made in script
      // for a Blob is not a template element and stays allowed.
      'vue/no-restricted-syntax': ['error', {
        selector: 'VElement[rawName="a"]',
        message: 'Use <NuxtLink> instead of a raw <a>.',
      }],
      // The house layout leaves these free: type members end with a comma or a line break,
      // arrow parameters with or without parentheses, short guards such as `if (!row) return`
      // share a line, and long element tags stay on one line.
      '@stylistic/member-delimiter-style': 'off',
      '@stylistic/arrow-parens': 'off',
      '@stylistic/max-statements-per-line': 'off',
      // Chains of `a ? b\n : c ? d` and queries continued under a ternary keep their own indent.
      '@stylistic/indent': 'off',
      '@stylistic/multiline-ternary': 'off',
      // `try { … } catch { … }` may stay on one line; a union type starts on the line after `=`.
      '@stylistic/brace-style': ['error', 'stroustrup', { allowSingleLine: true }],
      '@stylistic/operator-linebreak': ['error', 'before', { overrides: { '=': 'after' } }],
      // nuxt.config.ts is grouped by topic, not in the schema's order.
      'nuxt/nuxt-config-keys-order': 'off',
      'vue/max-attributes-per-line': 'off',
      'vue/singleline-html-element-content-newline': 'off',
      // Optional props of a typed defineProps are undefined unless given; no default is needed.
      'vue/require-default-prop': 'off',
      // `catch {}` marks an error deliberately ignored (a best-effort clean-up).
      'no-empty': ['error', { allowEmptyCatch: true }],
      // Shown, not failed: narrowing these is the work of the shared `issuesOf(error)` helper.
      '@typescript-eslint/no-explicit-any': 'warn',
    },
  },
  {
    // Tests and benchmarks read untyped JSON answers on purpose.
    files: ['tests/**', 'bench/**'],
    rules: { '@typescript-eslint/no-explicit-any': 'off' },
  },
  {
    // The yardstick app of bench:weight is Nuxt's smallest app, named as Nuxt names it.
    files: ['tests/fixtures/bare-nuxt/**'],
    rules: { 'vue/multi-word-component-names': 'off' },
  },
)
