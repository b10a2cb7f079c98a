import js from '@eslint/js';
import tseslint from 'typescript-eslint';
import reactHooks from 'eslint-plugin-react-hooks';
import globals from 'globals';
import fs from 'node:fs';

const CLIENT_NEVER_IMPORTS_SERVER = { group: ['@server/*', '../server/*', '../../server/*'], message: 'The client never imports server code.' };
// One home per rule (DEVELOPERS.md): query keys only from src/lib/query-keys.ts, page paths and the
// addresses of served files only from shared/paths.ts. These selectors catch them spelled by hand.
const QUERY_CLIENT_CALLS = /^(invalidateQueries|refetchQueries|removeQueries|cancelQueries|resetQueries|getQueryData|setQueryData|getQueriesData|setQueriesData|ensureQueryData|prefetchQuery|fetchQuery|isFetching)$/;
const HAND_KEYS = [
  { selector: "Property[key.name='queryKey'] > ArrayExpression", message: 'Query keys come from src/lib/query-keys.ts (e.g. surveyKeys.detail(id)), never an array spelled here.' },
  { selector: `CallExpression[callee.property.name=${QUERY_CLIENT_CALLS}] > ArrayExpression`, message: 'Query keys come from src/lib/query-keys.ts, never an array spelled here.' },
  { selector: "CallExpression[callee.property.name='slice'][callee.object.property.name='queryKey']", message: 'Refresh a level of a key object from src/lib/query-keys.ts (surveyKeys.lists(), .details()) instead of cutting a query key.' },
];
const API_FILE_LITERAL = [
  { selector: 'Literal[value=/^\\/api\\//]', message: 'Addresses of served files come from apiFiles in shared/paths.ts; JSON endpoints go through the api helper.' },
  { selector: 'TemplateElement[value.raw=/^\\/api\\//]', message: 'Addresses of served files come from apiFiles in shared/paths.ts; JSON endpoints go through the api helper.' },
];
// Dates and times on screen go through shared/datetime.ts (one format, the site's zone).
const HAND_DATES = [
  { selector: 'MemberExpression[property.name=/^(toLocaleDateString|toLocaleTimeString)$/]', message: 'Dates and times go through shared/datetime.ts (formatDay, formatDateTime, formatClock, formatCalendarDay).' },
  { selector: "MemberExpression[object.name='Intl'][property.name='DateTimeFormat']", message: 'Dates and times go through shared/datetime.ts (formatDay, formatDateTime, formatClock, formatCalendarDay, viewerTimeZone).' },
];
const LINK_ATTRIBUTES = 'JSXAttribute[name.name=/^(to|href)$/]';
const HAND_PAGE_LINKS = [
  { selector: `${LINK_ATTRIBUTES} > Literal[value=/^\\/(?!samples\\/)/]`, message: 'Links come from paths in shared/paths.ts (paths.survey.to(id)).' },
  { selector: `${LINK_ATTRIBUTES} > JSXExpressionContainer > Literal[value=/^\\//]`, message: 'Links come from paths in shared/paths.ts (paths.survey.to(id)).' },
  { selector: `${LINK_ATTRIBUTES} > JSXExpressionContainer > TemplateLiteral`, message: 'Links come from paths in shared/paths.ts (paths.survey.to(id)).' },
  { selector: "CallExpression[callee.name=/^(navigate|redirect)$/] > :matches(Literal[value=/^\\//], TemplateLiteral)", message: 'Navigation targets come from paths in shared/paths.ts.' },
];
// On the server, a string that starts like a path is a page link or a served file spelled by hand
// (e-mails use absoluteUrl(publicUrl, paths.x.to(id))); route declarations give theirs as `path:`.
const SERVER_HAND_PATHS = [
  { selector: ":not(Property[key.name='path']) > Literal[value=/^\\/[a-z]/]", message: 'Page links come from paths, served files from apiFiles (shared/paths.ts).' },
  { selector: 'TemplateLiteral > TemplateElement:first-child[value.raw=/^\\/[a-z]/]', message: 'Page links come from paths, served files from apiFiles (shared/paths.ts).' },
  { selector: "TemplateLiteral > :matches(MemberExpression[property.name='publicUrl'], Identifier[name='publicUrl'])", message: 'E-mailed links are absoluteUrl(publicUrl, paths.x.to(id)) (shared/paths.ts), never built by hand.' },
];
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
  { files: ['src/**/*.{ts,tsx}'], ignores: ['src/lib/query-keys.ts'], rules: { 'no-restricted-syntax': ['error', ...HAND_KEYS, ...API_FILE_LITERAL, ...HAND_PAGE_LINKS, ...HAND_DATES] } },
  // server/app.ts mounts the API and the client under their paths; the route table documents /api.
  { files: ['server/**/*.ts'], ignores: ['server/app.ts', 'server/http/api.ts', 'server/config.ts'], rules: { 'no-restricted-syntax': ['error', ...SERVER_HAND_PATHS] } },
  {
    files: ['shared/**/*.ts'],
    rules: {
      'no-restricted-imports': ['error', { patterns: [{ group: ['@/*', '@server/*', '../src/*', '../server/*', '../../src/*', '../../server/*'], message: 'shared/ imports neither src/ nor server/.' }] }],
    },
  },
);
