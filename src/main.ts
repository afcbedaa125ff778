// First: sends the first page's API reads before the rest of the app is evaluated.
import './api/startBootReads';
// Before any zod schema is built (see the file).
import './api/zodJitless';
// Fonts are shipped with the app (no request leaves the server): Inter for the interface,
// JetBrains Mono for addresses and values; only the latin subsets and the weights we use.
import '@fontsource/inter/latin-400.css';
import '@fontsource/inter/latin-500.css';
import '@fontsource/inter/latin-600.css';
import '@fontsource/jetbrains-mono/latin-400.css';
import './styles/base.css';

// The router before the app: it asks for the first page's code as soon as it is evaluated.
import { router } from './router';
import { createApp } from 'vue';
import { createPinia } from 'pinia';
import { VueQueryPlugin } from '@tanstack/vue-query';
import { createAppQueryClient } from './api/queryClient';
import App from './App.vue';

createApp(App).use(createPinia()).use(router).use(VueQueryPlugin, { queryClient: createAppQueryClient() }).mount('#app');
