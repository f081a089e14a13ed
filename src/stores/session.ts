import { defineStore } from 'pinia';
import { computed, ref } from 'vue';
import type { Person, Role, SignIn } from '../../shared/schemas/auth';
import * as authApi from '../api/auth';
import { DEFAULT_LOCALE, setFormatLocale } from '../../shared/format/locale';
import { ApiError } from '../api/client';

/** The signed-in person and their roles; loads `/api/auth/me` once per page load. */
export const useSessionStore = defineStore('session', () => {
  const person = ref<Person | null>(null);
  /** The studio's name (from the database), shown in the app's header. */
  const studioName = ref('');
  /** The locale (BCP 47) the studio writes money and dates in; the formatters use it once it is known. */
  const locale = ref(DEFAULT_LOCALE);
  let loading: Promise<void> | null = null;
  const loaded = ref(false);

  const roles = computed<Role[]>(() => person.value?.roles ?? []);
  const signedIn = computed(() => person.value !== null);

  /**
   * Whether the person holds at least one of the roles (admin does not imply the others).
   * @param wanted - roles, any of which is enough
   */
  function hasRole(...wanted: Role[]): boolean {
    return wanted.some((role) => roles.value.includes(role));
  }

  /** Loads the signed-in person once; later calls reuse the first answer. */
  function load(): Promise<void> {
    loading ??= authApi
      .fetchMe()
      .then((me) => {
        person.value = me.person;
        setStudio({ name: me.studioName, locale: me.locale });
      })
      .catch((err: unknown) => {
        if (err instanceof ApiError && err.status === 401) person.value = null;
        else {
          loading = null; // a network failure may pass: try again on the next navigation
          throw err;
        }
      })
      .finally(() => {
        loaded.value = true;
      });
    return loading;
  }

  /**
   * Signs in; throws ApiError (401 wrong credentials, 429 too many attempts, 400 bad input).
   * @param credentials - e-mail and password
   */
  async function signIn(credentials: SignIn): Promise<void> {
    const me = await authApi.signIn(credentials);
    person.value = me.person;
    setStudio({ name: me.studioName, locale: me.locale });
    loading = Promise.resolve();
    loaded.value = true;
  }

  /** Forgets the person without asking the server (their session already ended there). */
  function forget(): void {
    person.value = null;
    loading = Promise.resolve();
  }

  /** Signs out; the local session is cleared even when the server cannot be reached. */
  async function signOut(): Promise<void> {
    try {
      await authApi.signOut();
    } finally {
      person.value = null;
      loading = Promise.resolve();
    }
  }

  /**
   * Takes the studio's name and locale (from the server, or at once after an admin changed them): the header shows
   * the name, and figures on every open screen are written again in the locale (it is kept in a ref, see main.ts).
   * @param studio - the studio's name and locale
   */
  function setStudio(studio: { name: string; locale: string }): void {
    studioName.value = studio.name;
    locale.value = studio.locale;
    setFormatLocale(studio.locale);
  }

  return { person, studioName, locale, setStudio, roles, signedIn, loaded, hasRole, load, signIn, signOut, forget };
});
