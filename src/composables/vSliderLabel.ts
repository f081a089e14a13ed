import type { Directive } from 'vue';

/**
 * `v-slider-label="'Floor width'"` on a Naive UI slider: gives its handle (the element with role="slider" that takes
 * the keyboard focus) an accessible name, which the component does not pass on from its own attributes. Runs after
 * every update, so a re-rendered handle is named again.
 */
export const vSliderLabel: Directive<HTMLElement, string> = {
  mounted: nameHandles,
  updated: nameHandles,
};

function nameHandles(el: HTMLElement, binding: { value: string }): void {
  for (const handle of el.querySelectorAll<HTMLElement>('[role="slider"], .n-slider-handle-wrapper')) {
    if (handle.getAttribute('aria-label') !== binding.value) handle.setAttribute('aria-label', binding.value);
  }
}
