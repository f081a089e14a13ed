/**
 * The production choice of the design editor: which printer, material and colour the figures are worked out for.
 * The last choice is remembered in this browser; a material without the chosen colour falls back to the remembered
 * colour, else its first one.
 */
import { computed, ref, watch, type ComputedRef, type Ref } from 'vue';
import type { PrinterProfile } from '../../shared/schemas/production';
import { useProductionStore } from '../stores/production';
import { useDesignStore } from '../stores/design';
import { FARM_PRINTER_ID } from '../../shared/production/defaults';
import type { ProductionChoice } from '../workers/geometryProtocol';

/** The id remembered in this browser under `key` when it is still in the list, else `fallback`. */
function remembered(key: string, ids: string[], fallback: string): string {
  const value = typeof localStorage !== 'undefined' ? localStorage.getItem(key) : null;
  return value && ids.includes(value) ? value : fallback;
}

/**
 * The printer last chosen in this browser, else the farm's everyday profile, else the largest build volume. All
 * three are printers from the database (the production store); FARM_PRINTER_ID is only the id of the seeded
 * everyday printer, preferred when the studio still has it, never a built-in profile used in its place.
 */
function initialPrinterId(printers: PrinterProfile[]): string {
  const volume = (item: PrinterProfile) => item.buildVolumeMm.x * item.buildVolumeMm.y * item.buildVolumeMm.z;
  const largest = [...printers].sort((a, b) => volume(b) - volume(a))[0];
  const farm = printers.find((item) => item.id === FARM_PRINTER_ID);
  return remembered(
    'nw.printerId',
    printers.map((item) => item.id),
    farm?.id ?? largest?.id ?? '',
  );
}

/** What {@link useProductionChoice} gives the editor. */
export interface ProductionChoiceState {
  printerId: Ref<string>;
  materialId: Ref<string>;
  colourId: Ref<string>;
  printer: ComputedRef<PrinterProfile | null>;
  /** The objects the worker's figures use; null until the catalogue and a choice are in. */
  productionChoice: ComputedRef<ProductionChoice | null>;
  /** The chosen printer's build volume for the viewer's plate. */
  buildVolume: ComputedRef<{ widthMm: number; depthMm: number; heightMm: number } | undefined>;
  /** Printer options of the printer picker. */
  printerOptions: ComputedRef<Array<{ label: string; value: string }>>;
  /** Picks the remembered (or first sensible) printer and material once the catalogue is in. */
  chooseInitial(): void;
}

/** The editor's printer, material and colour, remembered in this browser. */
export function useProductionChoice(): ProductionChoiceState {
  const production = useProductionStore();
  const design = useDesignStore();
  const printerId = ref('');
  const materialId = ref('');
  const colourId = ref('');

  function chooseInitial(): void {
    const printers = production.printers;
    const materials = production.materials;
    if (!printers.some((item) => item.id === printerId.value)) printerId.value = initialPrinterId(printers);
    if (!materials.some((item) => item.id === materialId.value))
      materialId.value = remembered(
        'nw.materialId',
        materials.map((item) => item.id),
        materials[0]?.id ?? '',
      );
  }
  watch(printerId, (id) => id && localStorage.setItem('nw.printerId', id));
  watch(materialId, (id) => id && localStorage.setItem('nw.materialId', id));
  watch(colourId, (id) => id && localStorage.setItem('nw.colourId', id));

  const printer = computed(() => production.printers.find((item) => item.id === printerId.value) ?? null);
  const material = computed(() => production.materials.find((item) => item.id === materialId.value) ?? null);
  watch(
    material,
    (chosen) => {
      if (!chosen || chosen.colours.some((item) => item.id === colourId.value)) return;
      colourId.value = remembered(
        'nw.colourId',
        chosen.colours.map((item) => item.id),
        chosen.colours[0].id,
      );
    },
    { immediate: true },
  );
  const colour = computed(() => material.value?.colours.find((item) => item.id === colourId.value) ?? null);
  const productionChoice = computed<ProductionChoice | null>(() => {
    const catalogue = production.catalogue;
    if (!catalogue || !printer.value || !material.value || !colour.value) return null;
    return {
      printer: printer.value,
      material: material.value,
      colour: colour.value,
      // The design's own perimeters and infill (from the wall-recipe optimizer) over the studio's settings.
      settings: {
        ...catalogue.settings,
        ...(design.printRecipe.perimeters !== null ? { perimeters: design.printRecipe.perimeters } : {}),
        ...(design.printRecipe.infillPct !== null ? { infillPct: design.printRecipe.infillPct } : {}),
      },
      rates: catalogue.rates,
    };
  });
  const buildVolume = computed(() =>
    printer.value
      ? {
          widthMm: printer.value.buildVolumeMm.x,
          depthMm: printer.value.buildVolumeMm.y,
          heightMm: printer.value.buildVolumeMm.z,
        }
      : undefined,
  );
  const printerOptions = computed(() =>
    production.printers.map((item) => ({
      label: `${item.name} · ${item.buildVolumeMm.x}×${item.buildVolumeMm.y}×${item.buildVolumeMm.z} mm`,
      value: item.id,
    })),
  );
  return {
    printerId,
    materialId,
    colourId,
    printer,
    productionChoice,
    buildVolume,
    printerOptions,
    chooseInitial,
  };
}
