/** The gable box's parameters, and which of them its shell and its floor plug depend on (their cache keys). */
import { z } from 'zod';
import { commonParameters } from './lib/commonParameters';

export const parameters = z
  .object({
    entryHoleDiameterMm: commonParameters.entryHoleDiameterMm(32),
    holeAboveFloorMm: commonParameters.holeAboveFloorMm(130),
    floorWidthMm: z.number().min(80).max(200).default(112).meta({
      label: 'Floor width',
      unit: 'mm',
      step: 1,
      help: 'Inside floor, side to side.',
    }),
    floorDepthMm: z.number().min(80).max(200).default(120).meta({
      label: 'Floor depth',
      unit: 'mm',
      step: 1,
      help: 'Inside floor, front to back.',
    }),
    cavityDepthMm: z.number().min(120).max(300).default(170).meta({
      label: 'Cavity depth',
      unit: 'mm',
      step: 1,
      help: 'Inside floor up to where the roof meets the side walls; keep the top of the entry below it. Over about 180 mm the box no longer fits a 250 mm build height.',
    }),
    wallThicknessMm: commonParameters.wallThicknessMm(10),
    roofPitchDeg: z.number().min(45).max(65).default(47).meta({
      label: 'Roof pitch',
      unit: 'deg',
      step: 1,
      help: 'Roof slope from horizontal. The box prints roof-down, so 45° or steeper keeps the roof self-supporting.',
    }),
    ridgeFlatMm: z.number().min(3).max(20).default(6.35).meta({
      label: 'Ridge strip width',
      unit: 'mm',
      step: 0.05,
      help: 'The ridge is cut to a flat strip that rests on the build plate; wider holds better on the plate.',
    }),
    roofOverhangMm: z.number().min(0).max(50).default(25).meta({
      label: 'Roof overhang',
      unit: 'mm',
      step: 1,
      help: 'How far the roof reaches past the side and front walls; it shades the box and keeps rain off the entry.',
    }),
    trimStyle: z.enum(['none', 'shingles', 'boards']).default('none').meta({
      label: 'Trim',
      unit: '',
      help: 'Shingle rows on the roof or board grooves on the walls; both print without support.',
    }),
    ventilationSlots: commonParameters.ventilationSlots(2),
    drainageHoles: commonParameters.drainageHoles(4),
    hangingHole: commonParameters.hangingHole(true),
    perch: commonParameters.perch(),
    printClearanceMm: commonParameters.printClearanceMm(),
  })
  .strict();

/** The gable box's parameters after parsing. */
export type GableParams = z.output<typeof parameters>;

/** Parameters the floor plug depends on. */
export const PLUG_KEYS = [
  'floorWidthMm',
  'floorDepthMm',
  'wallThicknessMm',
  'printClearanceMm',
  'drainageHoles',
] as const;
/** Parameters the shell depends on: everything but the entry and the perch. */
export const SHELL_KEYS = [
  'floorWidthMm',
  'floorDepthMm',
  'cavityDepthMm',
  'wallThicknessMm',
  'roofPitchDeg',
  'ridgeFlatMm',
  'roofOverhangMm',
  'trimStyle',
  'ventilationSlots',
  'hangingHole',
] as const;
