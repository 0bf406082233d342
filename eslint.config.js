// ESLint flat config: typescript-eslint's recommended rules (syntax only, no type information, so
// `npm run lint` stays fast; vue-tsc does the type checking) and eslint-plugin-vue's recommended
// rules, with eslint-config-prettier last so no rule argues with Prettier about layout.
import { defineConfig } from 'eslint/config'
import tseslint from 'typescript-eslint'
import vue from 'eslint-plugin-vue'
import prettier from 'eslint-config-prettier'

export default defineConfig(
  {
    ignores: [
      'dist/**',
      'dist-server/**',
      'node_modules/**',
      '.data/**',
      'uploads/**',
      'test-output/**',
      'bench-out/**',
      'coverage/**',
    ],
  },
  ...tseslint.configs.recommended,
  ...vue.configs['flat/recommended'],
  {
    files: ['**/*.vue'],
    languageOptions: {
      parserOptions: {
        parser: tseslint.parser,
        extraFileExtensions: ['.vue'],
        sourceType: 'module',
      },
    },
  },
  {
    files: ['**/*.{ts,vue,js}'],
    rules: {
      // TypeScript reports undefined names itself, with the real globals of each environment.
      'no-undef': 'off',
      '@typescript-eslint/no-unused-vars': [
        'error',
        { argsIgnorePattern: '^_', varsIgnorePattern: '^_', caughtErrorsIgnorePattern: '^_' },
      ],
      'vue/multi-word-component-names': 'error',
      eqeqeq: ['error', 'always', { null: 'ignore' }],
      'no-debugger': 'error',
      'prefer-const': 'error',
    },
  },
  prettier,
)
