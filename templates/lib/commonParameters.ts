import { z } from 'zod';

/**
 * Parameter fields several templates share, so labels, ranges and help texts (and their cautions) read the same in
 * every template. Each is a function so a template can choose its own default.
 */
export const commonParameters = {
  /** Entry-hole diameter. 22–65 mm spans wrens and tits up to starlings and small owls' prey birds. */
  entryHoleDiameterMm: (defaultMm = 32) =>
    z.number().min(22).max(65).default(defaultMm).meta({
      label: 'Entry-hole diameter',
      unit: 'mm',
      step: 0.5,
      help: 'Sets which species can enter: about 25–28 mm tits only, 32 mm most small hole nesters, 45 mm starlings. Check local guidance for invasive species.',
    }),
  /** Floor to the bottom edge of the entry hole. */
  holeAboveFloorMm: (defaultMm = 130) =>
    z.number().min(60).max(220).default(defaultMm).meta({
      label: 'Hole height above floor',
      unit: 'mm',
      step: 1,
      help: 'Inside floor to the bottom edge of the hole; published guidance asks for at least 120–125 mm so cats and corvids cannot reach the nest.',
    }),
  /** Wall thickness of the chamber. */
  wallThicknessMm: (defaultMm = 10) =>
    z.number().min(4).max(20).default(defaultMm).meta({
      label: 'Wall thickness',
      unit: 'mm',
      step: 0.5,
      help: 'Thick printed walls with air-filled infill insulate against heat and cold; thin plastic boxes overheat and hold condensation.',
    }),
  /** Ventilation slots per side. */
  ventilationSlots: (defaultCount = 2) =>
    z.number().int().min(0).max(6).default(defaultCount).meta({
      label: 'Ventilation slots per side',
      unit: 'count',
      step: 1,
      help: 'Narrow slots high on the sides let hot air out; their pointed ends print without support.',
    }),
  /** Drainage holes in the floor. */
  drainageHoles: (defaultCount = 4) =>
    z.number().int().min(0).max(8).default(defaultCount).meta({
      label: 'Drainage holes',
      unit: 'count',
      step: 1,
      help: 'Small holes (6 mm) in the floor let rain and droppings drain away.',
    }),
  /** Perch under the entry (off by default). */
  perch: () =>
    z.boolean().default(false).meta({
      label: 'Perch under the entry',
      unit: '',
      help: 'Off by default: most guidance advises against perches because they help predators and unwanted species (starlings, house sparrows) reach the nest; cavity nesters do not need one.',
    }),
  /** Hanging hole. */
  hangingHole: (defaultOn = true) =>
    z.boolean().default(defaultOn).meta({
      label: 'Hanging hole',
      unit: '',
      help: 'A screw or wire hole to hang the box; mount it out of reach of predators and follow local guidance on height.',
    }),
  /** Cleaning access through a removable floor plug (on by default); a template may word the help for its shape. */
  cleaningAccess: (
    help = 'A round floor plug, printed as a separate part, so old nests can be removed after the season.',
  ) =>
    z.boolean().default(true).meta({
      label: 'Cleaning access',
      unit: '',
      help,
    }),
  /** Print clearance between a removable part and its seat. */
  printClearanceMm: () =>
    z.number().min(0.1).max(1).default(0.3).meta({
      label: 'Print clearance',
      unit: 'mm',
      step: 0.05,
      help: 'Gap per side between the removable part and its seat; about 0.2–0.5 mm suits most printers. Test-print a fit first.',
    }),
} as const;
