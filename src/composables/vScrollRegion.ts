import type { Directive } from 'vue';

/**
 * `v-scroll-region="'Quotes'"` on a Naive UI data table that scrolls sideways: makes its scroll container reachable
 * by keyboard (tabindex 0) and names it as a region, so a person without a mouse can scroll the columns into view
 * even when the rows hold nothing focusable. Runs after every update (the container is re-rendered with the data).
 */
export const vScrollRegion: Directive<HTMLElement, string> = {
  mounted: markRegion,
  updated: markRegion,
};

function markRegion(el: HTMLElement, binding: { value: string }): void {
  for (const container of el.querySelectorAll<HTMLElement>('.n-scrollbar-container')) {
    if (container.getAttribute('tabindex') !== '0') container.setAttribute('tabindex', '0');
    if (container.getAttribute('role') !== 'region') container.setAttribute('role', 'region');
    const name = `${binding.value} (scrolls sideways)`;
    if (container.getAttribute('aria-label') !== name) container.setAttribute('aria-label', name);
  }
}
