// Console entry: partners and network admins run their work here.
import { createApp } from 'vue';
import { createPinia } from 'pinia';
import '@emberline/ui/fonts';
import '@emberline/ui/styles.css';
import App from './app.vue';
import { i18n } from './locales';
import { createAppRouter } from './router';

const app = createApp(App);
app.use(createPinia());
app.use(createAppRouter());
app.use(i18n);
app.mount('#app');
