import { defineStore } from 'pinia';
import { ref } from 'vue';
import type { FamilyAction, FamilyCreate, FamilyUpdate } from '../../shared/schemas/familySpec';
import type { AcknowledgementsCreate } from '../../shared/schemas/gate';
import type { Family, FamilyListQuery, FamilySummary } from '../../shared/schemas/family';
import * as familiesApi from '../api/families';

/** Variant families: the list the person may see and the family open on screen, with its workflow actions. */
export const useFamiliesStore = defineStore('families', () => {
  const list = ref<FamilySummary[]>([]);
  const listLoading = ref(false);
  /** The family open on screen (detail, editor or review), as the server last sent it. */
  const current = ref<Family | null>(null);

  function keep(family: Family): Family {
    current.value = family;
    const index = list.value.findIndex((item) => item.id === family.id);
    if (index >= 0) {
      list.value.splice(index, 1, {
        ...list.value[index],
        name: family.name,
        state: family.state,
        revision: family.revision,
        publishedRevision: family.publishedRevision,
        variantCount: family.variantCount,
        computeState: family.compute.state,
        gateOk: family.gate.ok,
        updatedAt: family.updatedAt,
      });
    }
    return family;
  }

  /**
   * Loads the list of families.
   * @param query - state filter and search text
   */
  async function loadList(query: FamilyListQuery = {}): Promise<void> {
    listLoading.value = true;
    try {
      list.value = await familiesApi.listFamilies(query);
    } finally {
      listLoading.value = false;
    }
  }

  /**
   * Loads one family and makes it the current one.
   * @param id - family id
   */
  async function open(id: string): Promise<Family> {
    return keep(await familiesApi.getFamily(id));
  }

  /**
   * Creates a family and makes it the current one.
   * @param body - content and code
   */
  async function create(body: FamilyCreate): Promise<Family> {
    return keep(await familiesApi.createFamily(body));
  }

  /**
   * Changes the family (a published one opens a new draft revision).
   * @param id - family id
   * @param body - the fields to change
   */
  async function update(id: string, body: FamilyUpdate): Promise<Family> {
    return keep(await familiesApi.updateFamily(id, body));
  }

  /**
   * Stores written acknowledgements of bird-fit warnings.
   * @param id - family id
   * @param body - texts per warning code
   */
  async function acknowledge(id: string, body: AcknowledgementsCreate): Promise<Family> {
    return keep(await familiesApi.acknowledgeWarnings(id, body));
  }

  /**
   * Runs a workflow action on the family; the current family's revision and lock guard against acting on a stale
   * view (the server answers 409 `state_changed` when someone else acted first).
   * @param id - family id
   * @param action - the action
   * @param comments - the note (required for return, optional for every other step)
   */
  async function act(id: string, action: FamilyAction, comments?: string): Promise<Family> {
    const seen = current.value?.id === id ? current.value : null;
    const guard = seen ? { expectedRevision: seen.revision, expectedLock: seen.lock } : {};
    let family: Family;
    if (action === 'return')
      family = await familiesApi.transitionFamily(id, 'return', { ...guard, comments: comments ?? '' });
    else family = await familiesApi.transitionFamily(id, action, comments ? { ...guard, comment: comments } : guard);
    return keep(family);
  }

  return { list, listLoading, current, loadList, open, create, update, acknowledge, act, keep };
});
