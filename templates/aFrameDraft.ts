/**
 * The A-frame's draft body, built while a slider is held: the walls round the closed cavity as one mesh, with the
 * entry, the vents, the hanging-wire tunnel and the floor opening (or drainage holes) built into it as tubes, and the
 * crest and shingle slabs joined with the walls' section in 2D. Only the landing dowel and the perch are joined, and
 * the board grooves cut, with booleans. The same shape as the full body at coarser resolution, with far fewer kernel
 * operations (full builds keep theirs, and their hashes).
 */
import type { BuildContext } from './lib/BuildContext';
import { floorOpeningOutlines } from './lib/floorOpening';
import { hollowPrismY } from './lib/hollowPrism';
import { shingleOutlines } from './lib/shingleRows';
import type { Outline, Solid } from './lib/Solid';
import { teardropOutline } from './lib/teardrop';
import type { AFrameParams } from './aFrameParameters';
import {
  aFrameFrame,
  aFrameSections,
  boardGrooves,
  crestOutline,
  entryCentreZ,
  perch,
  placedDowel,
  shingleOptions,
  ventSlotOutlines,
} from './aFrameGeometry';

/** Segments round the entry and round the floor opening in a draft. */
const DRAFT_ENTRY_SEGMENTS = 16;
const DRAFT_OPENING_SEGMENTS = 24;

/**
 * The draft body: walls, cavity, entry, vents, crest and tunnel, trim and floor opening, landing dowel and perch.
 * @param p - the parsed parameters
 * @param context - a draft build's context (the landing dowel is reused from its cache)
 */
export function aFrameDraftBody(p: AFrameParams, context: BuildContext): Solid {
  const { W, D, frontY, backY } = aFrameFrame(p);
  const { bodyOutline, cavityOutline } = aFrameSections(p);
  const outlines: Outline[] = [bodyOutline];
  const holes: Outline[] = [];
  if (p.hangingHole) {
    const { crest, tunnelZ, tunnelDiameterMm } = crestOutline(p);
    outlines.push(crest);
    holes.push(teardropOutline(tunnelDiameterMm, 8).map(([u, v]): [number, number] => [u, v + tunnelZ]));
  }
  if (p.trimStyle === 'shingles') outlines.push(...shingleOutlines(shingleOptions(p, true)));
  const entryZ = entryCentreZ(p);
  const entry = teardropOutline(p.entryHoleDiameterMm, DRAFT_ENTRY_SEGMENTS).map(([u, v]): [number, number] => [
    u,
    v + entryZ,
  ]);
  const floor = floorOpeningOutlines({
    openingDiameterMm: Math.min(W, D) - 40,
    floorThicknessMm: p.wallThicknessMm,
    floorBottomZMm: 0,
    cleaningAccess: p.cleaningAccess,
    clearanceMm: p.printClearanceMm,
    drainageHoles: p.drainageHoles,
    segments: DRAFT_OPENING_SEGMENTS,
    draft: true,
  });
  const walls = hollowPrismY(
    { outlines, holes, fromYMm: frontY, toYMm: backY },
    { outline: cavityOutline, fromYMm: -D / 2, toYMm: D / 2 },
    { front: [entry], back: ventSlotOutlines(p), floor },
  );
  const additions: Solid[] = [];
  if (p.landingDowel) additions.push(placedDowel(p, context));
  if (p.perch) additions.push(perch(p, context));
  return walls.add(...additions).subtract(...(p.trimStyle === 'boards' ? boardGrooves(p) : []));
}
