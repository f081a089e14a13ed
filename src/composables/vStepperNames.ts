import type { Directive } from 'vue';

/**
 * `v-stepper-names="'Quantity'"` on a Naive UI number input: names its step buttons ("Less: Quantity",
 * "More: Quantity"), which the component renders as icon-only buttons with no accessible name. Runs after every
 * update, so re-rendered buttons are named again.
 */
export const vStepperNames: Directive<HTMLElement, string> = {
  mounted: nameButtons,
  updated: nameButtons,
};

function nameButtons(el: HTMLElement, binding: { value: string }): void {
  const buttons = el.querySelectorAll<HTMLButtonElement>('button');
  buttons.forEach((button, i) => {
    const name = `${i === 0 && buttons.length > 1 ? 'Less' : 'More'}: ${binding.value}`;
    if (button.getAttribute('aria-label') !== name) button.setAttribute('aria-label', name);
  });
}
