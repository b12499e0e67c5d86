import js from '@eslint/js';
import tseslint from 'typescript-eslint';
import reactHooks from 'eslint-plugin-react-hooks';
import globals from 'globals';

export default tseslint.config(
  {
    ignores: [
      'dist/**',
      'node_modules/**',
      'data/**',
      'drizzle/**',
      'test-results/**',
      'coverage/**',
    ],
  },
  js.configs.recommended,
  ...tseslint.configs.recommended,
  {
    files: ['**/*.{ts,tsx}'],
    languageOptions: {
      parserOptions: { projectService: true, tsconfigRootDir: import.meta.dirname },
      globals: { ...globals.browser, ...globals.node },
    },
    plugins: { 'react-hooks': reactHooks },
    rules: {
      ...reactHooks.configs.recommended.rules,
      'react-hooks/refs': 'off',
      'react-hooks/set-state-in-effect': 'off',
      '@typescript-eslint/no-floating-promises': 'error',
      '@typescript-eslint/no-unused-vars': [
        'error',
        { argsIgnorePattern: '^_', varsIgnorePattern: '^_' },
      ],
      '@typescript-eslint/consistent-type-imports': 'error',
      'no-restricted-imports': 'off',
    },
  },
  {
    files: ['shared/**/*.ts'],
    rules: {
      '@typescript-eslint/no-restricted-imports': [
        'error',
        {
          patterns: [
            {
              group: [
                'react',
                'react-dom',
                'three',
                '@react-three/*',
                'express',
                'drizzle-orm',
                'drizzle-orm/*',
                '@electric-sql/*',
                'better-auth',
                'better-auth/*',
                'pg',
                'zustand',
              ],
              message: 'shared/ is pure TypeScript: no React, three, Express or database imports',
            },
            // Imports flow one way: src -> shared, server -> shared; shared imports neither.
            {
              group: ['@/*', '**/src/**', '**/server/**'],
              message: 'shared/ must not import from src/ or server/',
            },
          ],
        },
      ],
    },
  },
  {
    files: ['src/**/*.{ts,tsx}'],
    rules: {
      '@typescript-eslint/no-restricted-imports': [
        'error',
        {
          patterns: [
            {
              group: [
                '@shared/report/calc-sheet-pdf',
                '**/report/calc-sheet-pdf',
                '**/report/woff',
                'pdfkit',
              ],
              message:
                'the calc sheet PDF renderer is Node only (pdfkit, font files): link to the server route instead',
            },
            {
              group: [
                '**/server/**',
                'express',
                'drizzle-orm',
                'drizzle-orm/*',
                '@electric-sql/*',
                'pg',
              ],
              message: 'the client must not import server code',
            },
          ],
        },
      ],
    },
  },
  {
    files: ['server/**/*.ts'],
    rules: {
      '@typescript-eslint/no-restricted-imports': [
        'error',
        {
          patterns: [
            {
              group: ['@/*', '**/src/**', 'react', 'react-dom', 'three', '@react-three/*'],
              message: 'the server must not import client code',
            },
          ],
        },
      ],
    },
  },
  {
    files: ['**/*.js', '**/*.cjs', '**/*.mjs'],
    ...tseslint.configs.disableTypeChecked,
    languageOptions: { globals: { ...globals.node } },
  },
);
