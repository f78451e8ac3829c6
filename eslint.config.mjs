// Flat ESLint config: typescript-eslint's recommended rules, the rules of hooks, type-only imports.
import reactHooks from 'eslint-plugin-react-hooks';
import tseslint from 'typescript-eslint';

export default tseslint.config(
  { ignores: ['node_modules/', 'dist/', '.expo/', '.data/', 'test-results/', 'tests/artifacts/', 'public/sw.js', 'expo-env.d.ts'] },
  ...tseslint.configs.recommended,
  {
    plugins: { 'react-hooks': reactHooks },
    rules: {
      'react-hooks/rules-of-hooks': 'error',
      'react-hooks/exhaustive-deps': 'warn',
      '@typescript-eslint/consistent-type-imports': ['error', { fixStyle: 'inline-type-imports' }],
      '@typescript-eslint/no-unused-vars': ['error', { argsIgnorePattern: '^_', varsIgnorePattern: '^_', destructuredArrayIgnorePattern: '^_' }],
      // fonts and assets are loaded with require() as Metro expects
      '@typescript-eslint/no-require-imports': 'off',
    },
  },
);
