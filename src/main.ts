// The client's entry point: Quasar with Gapsight's brand, Pinia, the router; fonts bundled (no CDN); icons are inline SVG (quasar-options.ts).
import { createApp } from 'vue';
import { createPinia } from 'pinia';
import { Quasar } from 'quasar';

import '@fontsource/roboto-condensed/400.css';
import '@fontsource/roboto-condensed/500.css';
import '@fontsource/roboto-condensed/700.css';
import 'quasar/dist/quasar.css';
import './css/app.css';

import App from './App.vue';
import { quasarOptions } from './quasar-options';
import { createAppRouter } from './router';

const app = createApp(App);
app.use(createPinia()); // before the router: its guards read the session store
app.use(Quasar, quasarOptions);
app.use(createAppRouter());
app.mount('#app');
