/** The A-frame's parameters, and which of them its frame, floor plug, landing dowel and shell depend on (cache keys). */
import { z } from 'zod';
import { commonParameters } from './lib/commonParameters';

export const parameters = z
  .object({
    entryHoleDiameterMm: commonParameters.entryHoleDiameterMm(32),
    holeAboveFloorMm: commonParameters.holeAboveFloorMm(130),
    floorWidthMm: z.number().min(90).max(200).default(130).meta({
      label: 'Floor width',
      unit: 'mm',
      step: 1,
      help: 'Inside floor, side to side (where the sloped walls stand).',
    }),
    floorDepthMm: z.number().min(80).max(200).default(120).meta({
      label: 'Floor depth',
      unit: 'mm',
      step: 1,
      help: 'Inside floor, front to back.',
    }),
    cavityDepthMm: z.number().min(150).max(320).default(200).meta({
      label: 'Inside height',
      unit: 'mm',
      step: 1,
      help: 'Inside floor up to the apex; short upright walls are added under the slopes when the slopes alone are too low.',
    }),
    wallThicknessMm: commonParameters.wallThicknessMm(10),
    roofPitchDeg: z.number().min(55).max(75).default(60).meta({
      label: 'Wall slope',
      unit: 'deg',
      step: 1,
      help: 'Slope of the A-frame walls from horizontal; 55° or steeper keeps their inside faces self-supporting.',
    }),
    landingDowel: z.boolean().default(true).meta({
      label: 'Landing dowel',
      unit: '',
      help: 'A flat-bottomed dowel with a rounded end at the foot of the front, printed with the first layers. It sits far below the entry; leave it off where predators are a concern.',
    }),
    landingDowelLengthMm: z.number().min(20).max(80).default(45).meta({
      label: 'Landing dowel length',
      unit: 'mm',
      step: 1,
      help: 'How far the landing dowel reaches in front of the box.',
    }),
    trimStyle: z.enum(['none', 'shingles', 'boards']).default('shingles').meta({
      label: 'Trim',
      unit: '',
      help: 'Shingle rows on the slopes or board grooves on the front; both print without support.',
    }),
    ventilationSlots: z.number().int().min(0).max(6).default(3).meta({
      label: 'Ventilation slots',
      unit: 'count',
      step: 1,
      help: 'Slots with pointed ends in the back gable; fewer are cut when the gable is too narrow for all of them.',
    }),
    drainageHoles: commonParameters.drainageHoles(4),
    hangingHole: commonParameters.hangingHole(true),
    perch: commonParameters.perch(),
    cleaningAccess: commonParameters.cleaningAccess(),
    printClearanceMm: commonParameters.printClearanceMm(),
  })
  .strict();

export type AFrameParams = z.output<typeof parameters>;

/** Parameters the frame (walls, cavity, slopes) depends on. */
export const FRAME_KEYS = ['floorWidthMm', 'floorDepthMm', 'cavityDepthMm', 'wallThicknessMm', 'roofPitchDeg'] as const;
/** Parameters the floor opening and its plug depend on. */
export const PLUG_KEYS = [
  'floorWidthMm',
  'floorDepthMm',
  'wallThicknessMm',
  'cleaningAccess',
  'printClearanceMm',
  'drainageHoles',
] as const;
/** Parameters the landing dowel depends on (it is built at y = 0 and moved to the front wall). */
export const DOWEL_KEYS = ['landingDowelLengthMm'] as const;
/** Parameters the shell depends on: everything but the entry and the perch. */
export const SHELL_KEYS = [
  ...FRAME_KEYS,
  ...PLUG_KEYS,
  'landingDowel',
  'landingDowelLengthMm',
  'trimStyle',
  'ventilationSlots',
  'hangingHole',
] as const;
