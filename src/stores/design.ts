import { defineStore } from 'pinia';
import { computed, ref } from 'vue';
import type { Preset } from '../../shared/schemas/preset';
import type { PrintRecipe } from '../../shared/schemas/wallRecipe';

/** How lengths are shown: millimetres (kept inside) or inches (shown only at the edge of the UI). */
export type LengthDisplay = 'mm' | 'in';

/** Parameter values of the design being edited: millimetres, booleans and choice keys. */
export type DesignParams = Record<string, number | boolean | string>;

/**
 * The design open in the editor: its template, its parameter values (always millimetres), the preset it came from
 * and whether it has unsaved changes.
 */
export const useDesignStore = defineStore('design', () => {
  const templateId = ref<string | null>(null);
  const params = ref<DesignParams>({});
  /** The preset this design was loaded from or saved as; null for a new design. */
  const preset = ref<Preset | null>(null);
  const savedParamsJson = ref('{}');
  /** Perimeters and infill chosen for this design (null: the studio's print settings), e.g. by the optimizer. */
  const printRecipe = ref<PrintRecipe>({ perimeters: null, infillPct: null });
  const lengthDisplay = ref<LengthDisplay>(
    typeof localStorage !== 'undefined' && localStorage.getItem('nw.lengthDisplay') === 'in' ? 'in' : 'mm',
  );

  const dirty = computed(() => JSON.stringify(params.value) !== savedParamsJson.value);

  /**
   * Starts a new design from a template's defaults.
   * @param id - template id
   * @param defaults - the template's default parameter values
   */
  function startNew(id: string, defaults: DesignParams): void {
    templateId.value = id;
    printRecipe.value = { perimeters: null, infillPct: null };
    params.value = { ...defaults };
    preset.value = null;
    savedParamsJson.value = JSON.stringify(params.value);
  }

  /**
   * Opens a saved preset; parameters missing from it (a newer template version) take the defaults.
   * @param saved - the preset
   * @param defaults - the template's default parameter values
   */
  function openPreset(saved: Preset, defaults: DesignParams): void {
    templateId.value = saved.templateId;
    printRecipe.value = { perimeters: null, infillPct: null };
    const known = Object.fromEntries(Object.entries(saved.params).filter(([key]) => key in defaults));
    params.value = { ...defaults, ...(known as DesignParams) };
    preset.value = saved;
    savedParamsJson.value = JSON.stringify(params.value);
  }

  /**
   * Records that the current parameters are saved as this preset.
   * @param saved - the preset as the server stored it
   */
  function markSaved(saved: Preset): void {
    preset.value = saved;
    savedParamsJson.value = JSON.stringify(params.value);
  }

  /**
   * Sets one parameter (millimetres for lengths).
   * @param key - parameter key
   * @param value - new value
   */
  function setParam(key: string, value: number | boolean | string): void {
    params.value = { ...params.value, [key]: value };
  }

  /**
   * Sets the design's perimeters and infill (null values fall back to the studio's print settings).
   * @param recipe - perimeters and infill
   */
  function setPrintRecipe(recipe: PrintRecipe): void {
    printRecipe.value = { ...recipe };
  }

  /**
   * Chooses how lengths are shown and remembers it in this browser.
   * @param display - mm or in
   */
  function setLengthDisplay(display: LengthDisplay): void {
    lengthDisplay.value = display;
    if (typeof localStorage !== 'undefined') localStorage.setItem('nw.lengthDisplay', display);
  }

  return {
    templateId,
    params,
    preset,
    dirty,
    lengthDisplay,
    startNew,
    openPreset,
    markSaved,
    setParam,
    printRecipe,
    setPrintRecipe,
    setLengthDisplay,
  };
});
