// First: sends the first page's API reads before the rest of the app is evaluated.
import './api/startBootReads';
// Fonts are shipped with the app (no request leaves the server): Inter for the interface,
// JetBrains Mono for addresses and values; only the latin subsets and the weights we use.
import '@fontsource/inter/latin-400.css';
import '@fontsource/inter/latin-500.css';
import '@fontsource/inter/latin-600.css';
import '@fontsource/jetbrains-mono/latin-400.css';
import './styles/base.css';

// Server answers are parsed with zod under a CSP that refuses `new Function`, so zod's compiled
// parsers are never available: saying so up front spares its probe, a CSP violation the browser
// reports (about a millisecond before the workbench's first paint). Parsing is the same.
import { config as zodConfig } from 'zod';
zodConfig({ jitless: true });

// The router before the app: it asks for the first page's code as soon as it is evaluated.
import { router } from './router';
import { createApp } from 'vue';
import { createPinia } from 'pinia';
import { VueQueryPlugin } from '@tanstack/vue-query';
import App from './App.vue';

createApp(App).use(createPinia()).use(router).use(VueQueryPlugin).mount('#app');
