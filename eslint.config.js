import js from '@eslint/js';
import tseslint from 'typescript-eslint';
import reactHooks from 'eslint-plugin-react-hooks';
import globals from 'globals';
import fs from 'node:fs';

const CLIENT_NEVER_IMPORTS_SERVER = { group: ['@server/*', '../server/*', '../../server/*'], message: 'The client never imports server code.' };
const FEATURES = fs.readdirSync(new URL('./src/features', import.meta.url), { withFileTypes: true }).filter((e) => e.isDirectory()).map((e) => e.name);

export default tseslint.config(
  { ignores: ['dist', 'node_modules', 'data', 'drizzle', 'coverage'] },
  js.configs.recommended,
  ...tseslint.configs.recommended,
  {
    languageOptions: { globals: { ...globals.browser, ...globals.node } },
    rules: {
      '@typescript-eslint/no-unused-vars': ['error', { argsIgnorePattern: '^_', varsIgnorePattern: '^_' }],
    },
  },
  {
    // Product code (tests keep small fixed arrays).
    files: ['server/**/*.{ts,mts,mjs}', 'shared/**/*.ts', 'src/**/*.{ts,tsx}'],
    rules: {
      // A spread or apply passes every element as an argument: over a survey's readings that
      // overflows the call stack (RangeError). Use simple-statistics' min/max or a loop.
      'no-restricted-syntax': ['error',
        { selector: "CallExpression[callee.object.name='Math'] > SpreadElement", message: 'No spread into Math.* (unbounded arrays overflow the stack): use min/max from simple-statistics or a loop.' },
        { selector: "CallExpression[callee.property.name='apply']", message: 'No .apply (unbounded argument lists overflow the stack).' },
      ],
    },
  },
  {
    files: ['src/**/*.{ts,tsx}'],
    plugins: { 'react-hooks': reactHooks },
    rules: {
      ...reactHooks.configs.recommended.rules,
      'no-restricted-imports': ['error', { patterns: [CLIENT_NEVER_IMPORTS_SERVER] }],
    },
  },
  // Features never import each other: a page that needs two features composes them in src/app/routes/.
  ...FEATURES.map((feature) => {
    const others = FEATURES.filter((f) => f !== feature);
    return {
      files: [`src/features/${feature}/**/*.{ts,tsx}`],
      rules: {
        'no-restricted-imports': ['error', { patterns: [CLIENT_NEVER_IMPORTS_SERVER, {
          group: others.flatMap((f) => [`@/features/${f}`, `@/features/${f}/*`, `../../${f}/*`, `../../../${f}/*`]),
          message: `src/features/${feature} may not import another feature; compose features in src/app/routes/.`,
        }] }],
      },
    };
  }),
  {
    files: ['shared/**/*.ts'],
    rules: {
      'no-restricted-imports': ['error', { patterns: [{ group: ['@/*', '@server/*', '../src/*', '../server/*', '../../src/*', '../../server/*'], message: 'shared/ imports neither src/ nor server/.' }] }],
    },
  },
);
