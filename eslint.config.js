// ESLint flat config: JavaScript + TypeScript + Vue recommended rules, and the rules that keep the
// architecture honest: `shared/` imports nothing from the UI, the server, the DOM or Node; `src/`
// never imports the standard labs, whose check scripts and reference solutions stay on the server.
import js from '@eslint/js';
import tseslint from 'typescript-eslint';
import pluginVue from 'eslint-plugin-vue';
import vueParser from 'vue-eslint-parser';
import globals from 'globals';

export default tseslint.config(
  { ignores: ['dist/**', 'node_modules/**', 'data/**', '.tmp/**', 'coverage/**', 'server/db/migrations/**'] },
  js.configs.recommended,
  ...tseslint.configs.recommended,
  ...pluginVue.configs['flat/recommended'],
  {
    files: ['**/*.vue'],
    languageOptions: { parser: vueParser, parserOptions: { parser: tseslint.parser, sourceType: 'module' } },
  },
  {
    languageOptions: { globals: { ...globals.browser, ...globals.node } },
    rules: {
      '@typescript-eslint/no-unused-vars': ['error', { argsIgnorePattern: '^_', varsIgnorePattern: '^_' }],
      'vue/multi-word-component-names': 'off',
      'vue/max-attributes-per-line': 'off',
      'vue/singleline-html-element-content-newline': 'off',
      'vue/html-self-closing': 'off',
    },
  },
  {
    files: ['shared/**/*.ts'],
    languageOptions: { globals: { ...globals['shared-node-browser'] } },
    rules: {
      'no-restricted-imports': [
        'error',
        {
          patterns: [
            { group: ['node:*'], message: 'shared/ is pure: no Node APIs.' },
            { group: ['vue', 'vue-*', 'pinia', 'naive-ui', 'konva', 'vue-konva'], message: 'shared/ has no UI.' },
            { group: ['express', 'drizzle-orm', 'drizzle-orm/*', '@electric-sql/*', 'nodemailer', 'pino*'], message: 'shared/ has no server code.' },
            { group: ['@/*', '../../src/*', '../../server/*', '../src/*', '../server/*'], message: 'shared/ imports neither src/ nor server/.' },
          ],
        },
      ],
      'no-restricted-globals': ['error', 'window', 'document', 'process', 'localStorage'],
    },
  },
  {
    // The browser bundle is public (the sign-in page names its chunks): of `shared/labs/` it may
    // load only the modules that carry no answers. tests/unit/labs/answersNotBundled.test.ts
    // builds the client and searches it for the labs' hidden checks and reference rungs.
    files: ['src/**'],
    rules: {
      'no-restricted-imports': [
        'error',
        {
          patterns: [
            {
              // `@shared/labs`, `../shared/labs/twoWire`…; not the three modules named below.
              regex: '(^|[/@])shared/labs(/(?!(safetyCaution|build|conveyorTags)(\\.ts)?$).*)?$',
              message: 'The standard labs hold hidden checks and reference solutions: server-only. The browser may import @shared/labs/safetyCaution, build and conveyorTags; anything else about standard labs comes from the API.',
            },
          ],
        },
      ],
    },
  },
);
