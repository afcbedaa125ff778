// ESLint flat config: JavaScript + TypeScript + Vue recommended rules, and the rules that keep the
// architecture honest: `shared/` imports nothing from the UI, the server, the DOM or Node, and
// reads no clock, timer or global random; `src/` never imports the standard labs, whose check
// scripts and reference solutions stay on the server.
import js from '@eslint/js';
import tseslint from 'typescript-eslint';
import pluginVue from 'eslint-plugin-vue';
import vueParser from 'vue-eslint-parser';
import globals from 'globals';
import { builtinModules } from 'node:module';

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
    // shared/ is pure and deterministic (no Node, no DOM, no clock, no global random): the same code
    // runs in the browser, on the server and in the command line, and gives the same results.
    files: ['shared/**/*.ts'],
    languageOptions: { globals: { ...globals['shared-node-browser'] } },
    rules: {
      'no-restricted-imports': [
        'error',
        {
          paths: builtinModules.filter((name) => !name.startsWith('_')).map((name) => ({ name, message: 'shared/ is pure: no Node APIs.' })),
          patterns: [
            { group: ['node:*', ...builtinModules.map((name) => `${name}/*`)], message: 'shared/ is pure: no Node APIs.' },
            { group: ['vue', 'vue-*', 'pinia', 'naive-ui', 'konva', 'vue-konva'], message: 'shared/ has no UI.' },
            { group: ['express', 'drizzle-orm', 'drizzle-orm/*', '@electric-sql/*', 'nodemailer', 'pino*'], message: 'shared/ has no server code.' },
            { group: ['@/*', '../../src/*', '../../server/*', '../src/*', '../server/*'], message: 'shared/ imports neither src/ nor server/.' },
          ],
        },
      ],
      'no-restricted-globals': [
        'error',
        ...['window', 'document', 'navigator', 'location', 'localStorage', 'sessionStorage', 'fetch', 'XMLHttpRequest'].map((name) => ({ name, message: 'shared/ has no DOM.' })),
        ...['process', 'Buffer', 'global', 'require', '__dirname', '__filename'].map((name) => ({ name, message: 'shared/ has no Node APIs.' })),
        ...['setTimeout', 'setInterval', 'setImmediate', 'clearTimeout', 'clearInterval', 'clearImmediate', 'queueMicrotask', 'requestAnimationFrame'].map((name) => ({
          name,
          message: 'shared/ has no timers: time is virtual and passed in.',
        })),
        { name: 'performance', message: 'shared/ reads no clock: time is passed in.' },
        { name: 'crypto', message: 'shared/ has no global random: randomness is passed in.' },
        { name: 'globalThis', message: 'shared/ reaches no host object; the one exception is the WebAssembly API (engine/wasm/host.ts).' },
      ],
      'no-restricted-properties': [
        'error',
        { object: 'Date', property: 'now', message: 'shared/ reads no clock: time is passed in.' },
        { object: 'Math', property: 'random', message: 'shared/ has no global random: randomness is passed in.' },
      ],
      'no-restricted-syntax': ['error', { selector: "NewExpression[callee.name='Date'][arguments.length=0]", message: 'shared/ reads no clock: new Date() is now; pass the time in.' }],
    },
  },
  {
    // The host's WebAssembly API, reached through globalThis so shared/ needs no DOM or Node types.
    files: ['shared/engine/wasm/host.ts'],
    rules: { 'no-restricted-globals': 'off' },
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
