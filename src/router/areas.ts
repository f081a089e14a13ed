import type { Component } from 'vue';
import type { Role } from '../../shared/schemas/auth';
import IconDesigns from '../components/icons/IconDesigns.vue';
import IconPeople from '../components/icons/IconPeople.vue';

/** One area of the product: a nav entry and a home-screen card. */
export interface Area {
  /** Stable id, e.g. `designs`, `families`, `review`, `catalogue`, `people`. */
  id: string;
  /** Label in the nav and on the home card. */
  label: string;
  /** One line on the home card saying what the area is for. */
  description: string;
  /** Path of the area's first screen; its route must exist in router/index.ts. */
  path: string;
  /** Roles that may open the area (any one is enough; admin does not imply the others). */
  roles: readonly Role[];
  /** Icon component (see components/icons/: IconDesigns, IconFamilies, IconReview, IconCatalogue, IconPeople). */
  icon: Component;
}

/**
 * Every area that exists, in nav order. A new screen adds one entry here (and its route in router/index.ts):
 * designs (designer), families (designer), review (catalogue_manager), catalogue (sales), people (admin).
 */
export const AREAS: readonly Area[] = [
  {
    id: 'designs',
    label: 'Designs',
    description: 'Shape nest boxes from templates, check them for printing and for birds, save presets, export files.',
    path: '/designs',
    roles: ['designer'],
    icon: IconDesigns,
  },
  {
    id: 'people',
    label: 'People',
    description: 'Add people to the studio and choose what each of them may do.',
    path: '/admin/people',
    roles: ['admin'],
    icon: IconPeople,
  },
];

/**
 * The areas a person may open, in nav order.
 * @param roles - the person's roles
 */
export function areasFor(roles: readonly Role[]): Area[] {
  return AREAS.filter((area) => area.roles.some((role) => roles.includes(role)));
}
