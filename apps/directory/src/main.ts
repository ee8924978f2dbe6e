// Directory entry: the public app where van owners find and book technicians.
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
