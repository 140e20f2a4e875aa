import { defineConfig, globalIgnores } from 'eslint/config';
import nextVitals from 'eslint-config-next/core-web-vitals';
import nextTypescript from 'eslint-config-next/typescript';
import reactHooks from 'eslint-plugin-react-hooks';

/**
 * Layer rules a path can express (DEVELOPERS.md, "Layout"): the browser never receives a
 * `*.server` module, lib/ never reaches up into components/, dsp/ stays free of the web app.
 */
const layers = {
  meta: { type: 'problem', docs: { description: 'Imports that cross a layer the layout forbids' }, schema: [] },
  create(context) {
    const file = context.filename.replaceAll('\\', '/');
    let clientModule = false;
    return {
      Program(program) {
        clientModule = program.body.some((s) => s.type === 'ExpressionStatement' && s.directive === 'use client');
      },
      ImportDeclaration(node) {
        const source = String(node.source.value);
        const typeOnly = node.importKind === 'type';
        if (clientModule && !typeOnly && /\.server$/.test(source)) {
          context.report({ node, message: `A 'use client' module must not import the server-only module ${source}; import its views.ts instead.` });
        }
        if (/\/lib\/.*(?<!\.server)\.tsx?$/.test(file) && !typeOnly && /\.server$/.test(source)) {
          context.report({ node, message: `A browser-safe lib module must not import ${source}: name this file *.server.ts, or move what it needs out of the server module.` });
        }
        if (/\/lib\//.test(file) && /^@\/components\//.test(source)) {
          context.report({ node, message: 'lib/ must not import from components/: move the shared type or helper into lib/.' });
        }
        if (/\/dsp\//.test(file) && /^(@\/(lib|models|app|components)\/|next(\/|$)|sequelize$)/.test(source)) {
          context.report({ node, message: 'dsp/ is plain TypeScript: no Next.js, database or web-app imports.' });
        }
      },
    };
  },
};

export default defineConfig([
  ...nextVitals,
  ...nextTypescript,
  // Every rule of the React hooks plugin's current recommendation, the compiler-based ones included.
  { files: ['**/*.{ts,tsx,mjs}'], rules: reactHooks.configs['recommended-latest'].rules },
  {
    files: ['**/*.{ts,tsx,mjs}'],
    plugins: { takeproof: { rules: { layers } } },
    rules: {
      'takeproof/layers': 'error',
      'no-control-regex': 'error',
      '@typescript-eslint/no-unused-vars': ['error', { argsIgnorePattern: '^_', varsIgnorePattern: '^_', destructuredArrayIgnorePattern: '^_' }],
      '@typescript-eslint/consistent-type-imports': ['error', { fixStyle: 'inline-type-imports' }],
    },
  },
  globalIgnores(['node_modules/**', '.next/**', '.next-*/**', 'var/**', 'next-env.d.ts', 'samples/**']),
]);
