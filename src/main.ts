import './zodJitless';
import { createApp, ref } from 'vue';
import { createPinia } from 'pinia';
import '../shared/schemas/humanMessages';
import '@fontsource/fraunces/500.css';
import '@fontsource/fraunces/600.css';
import '@fontsource/fraunces/700.css';
import '@fontsource/source-sans-3/400.css';
import '@fontsource/source-sans-3/400-italic.css';
import '@fontsource/source-sans-3/600.css';
import '@fontsource/source-sans-3/700.css';
import '@fontsource/jetbrains-mono/400.css';
import '@fontsource/jetbrains-mono/600.css';
import './styles/base.css';
import { applyPaletteVariables } from './styles/palette';
import { DEFAULT_LOCALE, keepFormatLocaleIn, setFormatTimeZone } from '../shared/format';
import App from './App.vue';
import { setUnauthorizedHandler } from './api/client';
import { router } from './router';
import { useSessionStore } from './stores/session';

applyPaletteVariables(document.documentElement);
// Times on screens are the viewer's wall-clock time; documents and mails stay in UTC (shared/format/date.ts).
setFormatTimeZone(Intl.DateTimeFormat().resolvedOptions().timeZone);
// The locale lives in a ref: amounts and dates on screen are written again when an admin saves another locale.
keepFormatLocaleIn(ref(DEFAULT_LOCALE));

const app = createApp(App);
app.use(createPinia());
app.use(router);

// A session that expires while a screen is open: forget the person and ask them to sign in again, then return.
setUnauthorizedHandler(() => {
  const session = useSessionStore();
  if (!session.signedIn) return;
  session.forget();
  const here = router.currentRoute.value;
  if (!here.meta.public) void router.replace({ name: 'sign-in', query: { next: here.fullPath } });
});
// The guard loads the session before the first screen shows, so no signed-out flash.
void router.isReady().then(() => app.mount('#app'));
