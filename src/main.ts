// Entry of the Varsmith web client.
import '@quasar/extras/roboto-font/roboto-font.css';
import '@quasar/extras/material-icons/material-icons.css';
import 'quasar/src/css/index.sass';
import './css/app.scss';
import { buildApp } from './boot/app';

const { app, router } = buildApp();
void router.isReady().then(() => app.mount('#app'));
