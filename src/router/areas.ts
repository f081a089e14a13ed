import type { Component } from 'vue';
import type { Role } from '../../shared/schemas/auth';
import IconCatalogue from '../components/icons/IconCatalogue.vue';
import IconDesigns from '../components/icons/IconDesigns.vue';
import IconCheckFile from '../components/icons/IconCheckFile.vue';
import IconFamilies from '../components/icons/IconFamilies.vue';
import IconJobs from '../components/icons/IconJobs.vue';
import IconMail from '../components/icons/IconMail.vue';
import IconPeople from '../components/icons/IconPeople.vue';
import IconSettings from '../components/icons/IconSettings.vue';
import IconReview from '../components/icons/IconReview.vue';
import IconQuotes from '../components/sales/IconQuotes.vue';
import IconDemand from '../components/farm/IconDemand.vue';
import IconFarm from '../components/farm/IconFarm.vue';
import IconOrders from '../components/orders/IconOrders.vue';

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
    id: 'check-file',
    label: 'Check a file',
    description: 'Upload an STL or 3MF: a print-readiness report, the best build orientations in 3D, the file turned.',
    path: '/check-file',
    roles: ['designer'],
    icon: IconCheckFile,
  },
  {
    id: 'families',
    label: 'Families',
    description: 'Spread a design into sizes, trims and colours, check every variant and submit the family for review.',
    path: '/families',
    roles: ['designer'],
    icon: IconFamilies,
  },
  {
    id: 'review',
    label: 'Review',
    description: 'Check submitted families variant by variant; approve, send back with comments, publish or retire.',
    path: '/review',
    roles: ['catalogue_manager'],
    icon: IconReview,
  },
  {
    id: 'catalogue',
    label: 'Catalogue',
    description: 'Find every published variant with its SKU, price and key figures.',
    path: '/catalogue',
    roles: ['sales', 'catalogue_manager', 'designer'],
    icon: IconCatalogue,
  },
  {
    id: 'quotes',
    label: 'Quotes',
    description: "Price wholesale orders against the farm's lead time; download spec sheets and price lists.",
    path: '/quotes',
    roles: ['sales', 'catalogue_manager'],
    icon: IconQuotes,
  },
  {
    id: 'demand',
    label: 'Demand',
    description: 'See what sells week by week, compare on-demand and planned-run costs, and plan runs at the farm.',
    path: '/demand',
    roles: ['operations', 'catalogue_manager', 'admin'],
    icon: IconDemand,
  },
  {
    id: 'farm-exceptions',
    label: 'Farm exceptions',
    description:
      'Orders the farm holds (address, colour) or cannot take yet: fix and send again, or cancel and refund.',
    path: '/farm/exceptions',
    roles: ['operations', 'admin'],
    icon: IconFarm,
  },
  {
    id: 'orders',
    label: 'Orders',
    description: 'Follow shop orders from payment to the door; ship, cancel and refund; export them as CSV.',
    path: '/orders',
    roles: ['operations', 'admin'],
    icon: IconOrders,
  },
  {
    id: 'people',
    label: 'People',
    description: 'Add people to the studio and choose what each of them may do.',
    path: '/admin/people',
    roles: ['admin'],
    icon: IconPeople,
  },
  {
    id: 'settings',
    label: 'Settings',
    description: 'The studio name, printers, materials and colours, print settings, cost rates, packaging and farm.',
    path: '/admin/settings',
    roles: ['admin'],
    icon: IconSettings,
  },
  {
    id: 'mail',
    label: 'E-mail',
    description: 'Read the messages Nestwright sent to the development mail server, and the outgoing queue.',
    path: '/admin/mail',
    roles: ['admin'],
    icon: IconMail,
  },
  {
    id: 'jobs',
    label: 'Failed jobs',
    description: 'Background work that failed every attempt: why, how often, when; run it again or discard it.',
    path: '/admin/jobs',
    roles: ['admin'],
    icon: IconJobs,
  },
];

/**
 * The areas a person may open, in nav order.
 * @param roles - the person's roles
 */
export function areasFor(roles: readonly Role[]): Area[] {
  return AREAS.filter((area) => area.roles.some((role) => roles.includes(role)));
}
