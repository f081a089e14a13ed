import type { Template } from './types';
import { BuildContext } from './lib/BuildContext';
import { Solid } from './lib/Solid';
import { slotAreaMm2, teardropOutline } from './lib/teardrop';
import { partMesh } from './lib/partMesh';
import { backMounting } from './lib/mountingText';
import { parameters, PLUG_KEYS, SHELL_KEYS, type AFrameParams } from './aFrameParameters';
import { aFrameDraftBody } from './aFrameDraft';
import {
  aFrameFloor,
  entryCentreZ,
  perch,
  aFrameFrame,
  aFrameMaxHoleAboveFloorMm,
  aFrameShell,
  HOLE_SEGMENTS,
  SLOT_LENGTH_MM,
  SLOT_WIDTH_MM,
  ventSlotCount,
} from './aFrameGeometry';

/**
 * A-frame printed floor-down: two steep sloped walls (with short upright walls under them when needed), a flat
 * landing dowel lying on the build plate, and an optional round floor plug. Entry faces −y.
 */
export const aFrame: Template<typeof parameters> = {
  id: 'a-frame',
  version: 3,
  name: 'A-frame',
  summary: 'Steep A-frame printed floor-down, with a landing dowel that prints with the first layers.',
  parameters,
  inUse: 'as-built',
  mounting: (_p, widthMm) => backMounting(null, widthMm),
  limits(p) {
    return {
      holeAboveFloorMm: {
        maxMm: aFrameMaxHoleAboveFloorMm(p),
        because: `for a ${p.cavityDepthMm} mm cavity with this floor width, roof pitch and entry (a 3 mm rim stays between the hole and the roof)`,
      },
    };
  },
  build(p, context = new BuildContext('full')) {
    const { t, W, D, floorZ, apexZ, Wo } = aFrameFrame(p);
    const body = context.draft ? aFrameDraftBody(p, context) : aFrameFullBody(p, context);
    const plugDiameterMm = Math.min(W, D) - 40;
    const plug = p.cleaningAccess
      ? context
          .reuse('floor-plug', p, PLUG_KEYS, (q) => aFrameFloor(q, context).plug!)
          .translate(Wo / 2 + 10 + plugDiameterMm / 2 + 8, 0, 0)
      : undefined;
    const slots = ventSlotCount(p);
    const parts = [{ name: 'body', mesh: partMesh(body) }];
    if (plug) parts.push({ name: 'floor-plug', mesh: partMesh(plug) });
    return {
      parts,
      facts: {
        entryHoleDiameterMm: p.entryHoleDiameterMm,
        floorWidthMm: W,
        floorDepthMm: D,
        cavityDepthMm: apexZ - floorZ,
        holeAboveFloorMm: p.holeAboveFloorMm,
        wallThicknessMm: t,
        hasPerch: p.perch,
        drainageHoleCount: p.drainageHoles,
        ventilationAreaMm2: slots * slotAreaMm2(SLOT_WIDTH_MM, SLOT_LENGTH_MM),
        cleaningAccess: p.cleaningAccess,
        chambers: 1,
      },
    };
  },
};

/** The full build's body: the reused shell (it does not depend on the entry or the perch), with the perch, less the entry. */
function aFrameFullBody(p: AFrameParams, context: BuildContext): Solid {
  const { D, frontY } = aFrameFrame(p);
  const shell = context.reuse('shell', p, SHELL_KEYS, (q) => aFrameShell(q, context));
  const hole = Solid.prism(
    teardropOutline(p.entryHoleDiameterMm, HOLE_SEGMENTS),
    'y',
    frontY - 1,
    -D / 2 + 1,
  ).translate(0, 0, entryCentreZ(p));
  return shell.add(...(p.perch ? [perch(p, context)] : [])).subtract(hole);
}
