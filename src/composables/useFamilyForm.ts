/**
 * The state of the family editor form: the fields, what is derived from them (variant count, SKU preview, clashes,
 * whether it may be saved), loading an existing family or a new one's template and preset, and saving.
 */
import { computed, onMounted, ref, watch } from 'vue';
import { useRoute, useRouter } from 'vue-router';
import { useMessage } from 'naive-ui';
import { FAMILY_MAX_VARIANTS, FamilyCodeSchema, type Axis, type AxisValue } from '../../shared/schemas/familySpec';
import type { Family } from '../../shared/schemas/family';
import type { Region } from '../../shared/schemas/birdfit';
import { familySpecProblems } from '../../shared/families/familySpecProblems';
import type { PrintRecipe, ProductionTargets } from '../../shared/schemas/wallRecipe';
import { findSkuClashes, skuFor } from '../../shared/families/sku';
import { variantCount } from '../../shared/families/variantMatrix';
import { loadTemplateCatalogue, type TemplateSummary } from '../api/templates';
import { ApiError } from '../api/ApiError';
import { useFamiliesStore } from '../stores/families';
import { usePresetsStore } from '../stores/presets';
import { axisProblems } from '../components/families/axisProblems';
import { summarySpecTemplate } from '../components/families/summarySpecTemplate';
import { useProductionStore } from '../stores/production';

/** The family editor's form (see the module comment); call once in the view's setup. */
export function useFamilyForm() {
  const route = useRoute();
  const router = useRouter();
  const message = useMessage();
  const families = useFamiliesStore();
  const presets = usePresetsStore();
  const production = useProductionStore();

  const familyId = computed(() => (typeof route.params.id === 'string' ? route.params.id : null));
  const templates = ref<TemplateSummary[]>([]);
  const loading = ref(true);
  const loadError = ref<string | null>(null);
  const saving = ref(false);
  const saveError = ref<string | null>(null);
  const fieldErrors = ref<Record<string, string>>({});
  const existing = ref<Family | null>(null);

  const name = ref('');
  const code = ref('');
  const description = ref('');
  const templateId = ref<string | null>(null);
  const presetId = ref<string | null>(null);
  const baseParams = ref<Record<string, AxisValue>>({});
  const axes = ref<Axis[]>([]);
  const supportBudgetCm3 = ref<number | null>(5);
  const printerId = ref('');
  const materialId = ref('');
  const region = ref<Region | null>(null);
  const targets = ref<ProductionTargets>({
    maxUnitCostCents: null,
    maxPrintHours: null,
    maxMassG: null,
    minInsulation: null,
  });
  const printRecipe = ref<PrintRecipe>({ perimeters: null, infillPct: null });
  /** Re-pin an existing family to the template's current version when saving. */
  const repin = ref(false);

  const template = computed(() => templates.value.find((item) => item.id === templateId.value) ?? null);
  const templateOptions = computed(() =>
    templates.value.map((item) => ({ label: `${item.name} (v${item.version})`, value: item.id })),
  );
  const presetOptions = computed(() =>
    (presets.byTemplate.get(templateId.value ?? '') ?? []).map((preset) => ({ label: preset.name, value: preset.id })),
  );
  // Printers and materials come from the studio's production catalogue (the database), like every other screen.
  const printerOptions = computed(() =>
    production.printers.map((printer) => ({
      label: `${printer.name} (${printer.buildVolumeMm.x}×${printer.buildVolumeMm.y}×${printer.buildVolumeMm.z} mm)`,
      value: printer.id,
    })),
  );
  const materialOptions = computed(() =>
    production.materials.map((material) => ({ label: material.name, value: material.id })),
  );

  /** Parameters shown in the base panel: those not varied by a parameter axis. */
  const baseParameters = computed(() => {
    const varied = new Set(axes.value.filter((axis) => axis.kind === 'param').map((axis) => axis.key));
    return (template.value?.parameters ?? []).filter((param) => !varied.has(param.key));
  });
  /** The family pins an older version of its template than the one installed now. */
  const staleTemplate = computed(
    () => !!existing.value && !!template.value && existing.value.templateVersion !== template.value.version,
  );
  const count = computed(() => variantCount(axes.value));
  const tooMany = computed(() => count.value > FAMILY_MAX_VARIANTS);
  const codeOk = computed(() => FamilyCodeSchema.safeParse(code.value).success);
  const skuClashes = computed(() => findSkuClashes(axes.value));
  const axisIssues = computed(() => axes.value.flatMap((axis) => axisProblems(axis, template.value?.parameters ?? [])));
  const skuExample = computed(() => {
    if (!codeOk.value || axes.value.some((axis) => !axis.values.length)) return null;
    return skuFor(code.value, axes.value, Object.fromEntries(axes.value.map((axis) => [axis.key, axis.values[0]])));
  });
  /** The shared family spec check (the one the server runs), so problems show before saving. */
  const specProblems = computed(() => {
    if (!template.value || !production.catalogue) return [];
    return familySpecProblems(
      {
        templateId: template.value.id,
        baseParams: baseParams.value,
        axes: axes.value,
        printerId: printerId.value,
        materialId: materialId.value,
      },
      summarySpecTemplate(template.value),
      new Map(production.printers.map((printer) => [printer.id, printer])),
      new Map(production.materials.map((material) => [material.id, material])),
    ).problems;
  });
  /**
   * Problems that belong to one axis (`axes.<n>…`), from the shared spec check, the SKU clash check and the server,
   * shown on that axis's card rather than in the side panel.
   */
  const axisFieldProblems = computed(() => {
    const all = [
      ...specProblems.value,
      ...skuClashes.value,
      ...Object.entries(fieldErrors.value).map(([path, text]) => ({ path, message: text })),
    ].filter((problem) => /^axes\.\d+/.test(problem.path));
    return all.filter(
      (problem, index) =>
        all.findIndex((other) => other.message === problem.message && other.path === problem.path) === index,
    );
  });
  /** Spec problems with no field of their own on the screen (the side panel lists them). */
  const otherSpecProblems = computed(() => specProblems.value.filter((problem) => !/^axes\.\d+/.test(problem.path)));

  /**
   * A server problem is about the input as it was sent: once the person changes that field, it no longer applies
   * and leaves the screen (so an old message never stands beside new input).
   */
  function forgetFieldErrors(prefix: string): void {
    const kept = Object.entries(fieldErrors.value).filter(
      ([path]) => path !== prefix && !path.startsWith(`${prefix}.`),
    );
    if (kept.length !== Object.keys(fieldErrors.value).length) {
      fieldErrors.value = Object.fromEntries(kept);
      if (!kept.length) saveError.value = null;
    }
  }
  watch(name, () => forgetFieldErrors('name'));
  watch(code, () => forgetFieldErrors('code'));
  watch(description, () => forgetFieldErrors('description'));
  watch(axes, () => forgetFieldErrors('axes'), { deep: true });
  watch(baseParams, () => forgetFieldErrors('baseParams'), { deep: true });
  watch(supportBudgetCm3, () => forgetFieldErrors('supportBudgetMm3'));
  watch(printerId, () => forgetFieldErrors('printerId'));
  watch(materialId, () => forgetFieldErrors('materialId'));

  const canSave = computed(
    () =>
      !!name.value.trim() &&
      (familyId.value !== null || codeOk.value) &&
      !!template.value &&
      !tooMany.value &&
      !skuClashes.value.length &&
      !axisIssues.value.length &&
      !specProblems.value.length &&
      supportBudgetCm3.value !== null,
  );

  function defaultsOf(summary: TemplateSummary): Record<string, AxisValue> {
    return { ...summary.defaults };
  }

  watch(templateId, (id, previous) => {
    if (!previous || !template.value || existing.value?.templateId === id) return;
    // A new template: its own defaults, and parameter axes of the old one no longer apply.
    baseParams.value = defaultsOf(template.value);
    axes.value = axes.value.filter((axis) => axis.kind === 'attribute');
    presetId.value = null;
  });

  function applyPreset(id: string | null): void {
    presetId.value = id;
    const preset = id ? presets.presets.find((item) => item.id === id) : null;
    if (!preset || !template.value) return;
    const values: Record<string, AxisValue> = defaultsOf(template.value);
    for (const [key, value] of Object.entries(preset.params)) {
      // Keys the current template version no longer has are left out (the server would refuse them).
      if (!(key in values)) continue;
      if (typeof value === 'number' || typeof value === 'string' || typeof value === 'boolean') values[key] = value;
    }
    baseParams.value = values;
    if (!name.value.trim()) name.value = preset.name;
  }

  onMounted(async () => {
    try {
      const [catalogue] = await Promise.all([
        loadTemplateCatalogue(),
        presets.loaded ? null : presets.loadAll(),
        production.ensureLoaded(),
      ]);
      if (production.error) throw new Error(`The printers and materials could not be loaded: ${production.error}`);
      templates.value = catalogue;
      printerId.value = production.printers[0]?.id ?? '';
      materialId.value = production.materials[0]?.id ?? '';
      if (familyId.value) {
        const family = await families.open(familyId.value);
        existing.value = family;
        name.value = family.name;
        code.value = family.code;
        description.value = family.description;
        templateId.value = family.templateId;
        baseParams.value = {
          ...defaultsOf(catalogue.find((t) => t.id === family.templateId) ?? catalogue[0]),
          ...family.baseParams,
        };
        axes.value = family.axes.map((axis) => ({ ...axis, values: [...axis.values] }) as Axis);
        supportBudgetCm3.value = family.supportBudgetMm3 / 1000;
        printerId.value = family.printerId;
        materialId.value = family.materialId;
        region.value = family.region;
        targets.value = { ...family.targets };
        printRecipe.value = { ...family.printRecipe };
      } else {
        const wanted = typeof route.query.template === 'string' ? route.query.template : catalogue[0]?.id;
        templateId.value = catalogue.find((t) => t.id === wanted)?.id ?? catalogue[0]?.id ?? null;
        if (template.value) baseParams.value = defaultsOf(template.value);
        if (typeof route.query.preset === 'string') applyPreset(route.query.preset);
      }
    } catch (err) {
      loadError.value = err instanceof Error ? err.message : String(err);
    } finally {
      loading.value = false;
    }
  });

  async function save(): Promise<void> {
    if (!canSave.value || !template.value) return;
    saving.value = true;
    saveError.value = null;
    fieldErrors.value = {};
    const spec = {
      name: name.value.trim(),
      description: description.value,
      baseParams: baseParams.value,
      axes: axes.value,
      supportBudgetMm3: Math.round((supportBudgetCm3.value ?? 0) * 1000),
      printerId: printerId.value,
      materialId: materialId.value,
      region: region.value,
      targets: targets.value,
      printRecipe: printRecipe.value,
    };
    try {
      const saved = familyId.value
        ? await families.update(familyId.value, {
            ...spec,
            expectedLock: existing.value?.lock,
            ...(repin.value ? { templateVersion: 'latest' as const } : {}),
          })
        : await families.create({ ...spec, templateId: template.value.id, code: code.value.trim() });
      message.success(
        familyId.value ? `Saved “${saved.name}” (revision ${saved.revision}).` : `Created “${saved.name}”.`,
      );
      await router.push({ name: 'family', params: { id: saved.id } });
    } catch (err) {
      if (err instanceof ApiError) {
        fieldErrors.value = err.fieldErrors;
        // The problem is shown at its field; the side panel only points there.
        saveError.value = Object.keys(err.fieldErrors).length ? 'The marked field says what to change.' : err.message;
      } else saveError.value = err instanceof Error ? err.message : String(err);
    } finally {
      saving.value = false;
    }
  }

  return {
    familyId,
    templates,
    loading,
    loadError,
    saving,
    saveError,
    fieldErrors,
    existing,
    name,
    code,
    description,
    templateId,
    presetId,
    baseParams,
    axes,
    supportBudgetCm3,
    printerId,
    materialId,
    region,
    targets,
    printRecipe,
    repin,
    template,
    templateOptions,
    presetOptions,
    printerOptions,
    materialOptions,
    baseParameters,
    staleTemplate,
    count,
    tooMany,
    codeOk,
    skuClashes,
    axisFieldProblems,
    otherSpecProblems,
    skuExample,
    specProblems,
    canSave,
    applyPreset,
    save,
  };
}
