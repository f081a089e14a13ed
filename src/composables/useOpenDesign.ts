import { computed, onMounted, ref, watch, type ComputedRef, type Ref } from 'vue';
import { onBeforeRouteLeave, onBeforeRouteUpdate, useRoute } from 'vue-router';
import { useDialog } from 'naive-ui';
import { loadTemplateCatalogue, type TemplateSummary } from '../api/templates';
import { ApiError } from '../api/ApiError';
import { useDesignStore } from '../stores/design';
import { usePresetsStore } from '../stores/presets';
import { useProductionStore } from '../stores/production';

/** The design the editor's route names, with its loading state. */
export interface OpenDesign {
  /** The template of the open design; null while loading or after a failed load. */
  template: Ref<TemplateSummary | null>;
  /** Why the design could not be opened; null after a good load. */
  loadError: Ref<string | null>;
  /** The preset's name, else "New <template>". */
  title: ComputedRef<string>;
}

/**
 * Opens the design of the current route in the design store when the view mounts and whenever the route's preset
 * or template changes: a saved preset (`:presetId`) or a new design of a template (`:templateId`). The printers and
 * materials are loaded first and `chooseInitial` picks the production choice. Leaving (or switching designs) with
 * unsaved changes asks first. Must be called from a component's setup.
 * @param chooseInitial - picks the printer, material and colour once the production store has loaded
 */
export function useOpenDesign(chooseInitial: () => void): OpenDesign {
  const route = useRoute();
  const dialog = useDialog();
  const design = useDesignStore();
  const presetsStore = usePresetsStore();
  const production = useProductionStore();
  const template = ref<TemplateSummary | null>(null);
  const loadError = ref<string | null>(null);
  const title = computed(() => design.preset?.name ?? `New ${template.value?.name ?? 'design'}`);

  async function open(): Promise<void> {
    loadError.value = null;
    try {
      await production.ensureLoaded();
      if (production.error) throw new Error(`The printers and materials could not be loaded: ${production.error}`);
      chooseInitial();
      const catalogue = await loadTemplateCatalogue();
      const presetId = route.params.presetId as string | undefined;
      if (presetId) {
        const preset = await presetsStore.fetchOne(presetId);
        const found = catalogue.find((item) => item.id === preset.templateId);
        if (!found) throw new Error(`The template "${preset.templateId}" of this preset no longer exists.`);
        template.value = found;
        design.openPreset(preset, found.defaults);
      } else {
        const templateId = route.params.templateId as string;
        const found = catalogue.find((item) => item.id === templateId);
        if (!found) throw new Error(`There is no template called "${templateId}".`);
        template.value = found;
        design.startNew(found.id, found.defaults);
      }
      if (!presetsStore.loaded) void presetsStore.loadAll().catch(() => undefined);
    } catch (err) {
      template.value = null;
      loadError.value =
        err instanceof ApiError && err.status === 404
          ? 'This design does not exist or is not yours.'
          : err instanceof Error
            ? err.message
            : String(err);
    }
  }

  onMounted(open);
  watch(() => [route.params.presetId, route.params.templateId], open);

  function confirmDiscard(): true | Promise<boolean> {
    if (!design.dirty) return true;
    return new Promise<boolean>((resolve) => {
      dialog.warning({
        title: 'Leave without saving?',
        content: 'The changes to this design are not saved as a preset yet.',
        positiveText: 'Leave',
        negativeText: 'Stay',
        onPositiveClick: () => resolve(true),
        onNegativeClick: () => resolve(false),
        onClose: () => resolve(false),
        onMaskClick: () => resolve(false),
      });
    });
  }

  // Saving marks the design clean before it navigates, so only real unsaved changes ask.
  onBeforeRouteLeave(confirmDiscard);
  onBeforeRouteUpdate(confirmDiscard);

  return { template, loadError, title };
}
