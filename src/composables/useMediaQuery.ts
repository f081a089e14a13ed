import { onBeforeUnmount, ref, type Ref } from 'vue';

/**
 * Whether a CSS media query matches, kept up to date while the component lives.
 * @param query - a media query, e.g. `(max-width: 960px)`
 */
export function useMediaQuery(query: string): Ref<boolean> {
  const list = window.matchMedia(query);
  const matches = ref(list.matches);
  const onChange = (event: MediaQueryListEvent): void => {
    matches.value = event.matches;
  };
  list.addEventListener('change', onChange);
  onBeforeUnmount(() => list.removeEventListener('change', onChange));
  return matches;
}
