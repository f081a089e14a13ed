import type { Template } from './types';
import { BuildContext } from './lib/BuildContext';
import { Solid } from './lib/Solid';
import { slotAreaMm2, teardropOutline, TEARDROP_TIP_RADII } from './lib/teardrop';
import { partMesh } from './lib/partMesh';
import { backMounting } from './lib/mountingText';
import { parameters, PLUG_KEYS, SHELL_KEYS } from './gableBoxParameters';
import { gableFrame, gablePlug, gableShell, HOLE_SEGMENTS, SLOT_LENGTH_MM, SLOT_WIDTH_MM } from './gableBoxGeometry';

/**
 * Gable box printed roof-down: the ridge is cut to a flat strip on the build plate, the roof pitch is at least 45°
 * so the roof needs no support, and the floor is a separate plug (cleaning access) printed beside the box.
 * Designed upright (floor at z = 0, entry facing −y), then turned over to print.
 */
export const gableBox: Template<typeof parameters> = {
  id: 'gable-box',
  version: 3,
  name: 'Gable box',
  summary: 'Classic pitched-roof box, printed roof-down on a flat ridge strip, with a removable floor plug.',
  parameters,
  inUse: 'turn-over-y',
  mounting: (_p, widthMm) => backMounting(null, widthMm),
  limits(p) {
    const { maxHoleAboveFloorMm } = gableFrame(p);
    return {
      holeAboveFloorMm: {
        maxMm: maxHoleAboveFloorMm,
        because: `for a ${p.cavityDepthMm} mm cavity with this floor width, roof pitch and entry (the entry stays 3 mm under the roof)`,
      },
    };
  },
  build(p, context = new BuildContext('full')) {
    const { t, W, D, Wo, o, floorZ } = gableFrame(p);
    const frontY = -D / 2 - t;
    const eaveX = Wo / 2 + o;

    // The shell (walls, roof, trim, vents, hanging hole) does not depend on the entry or the perch.
    const shell = context.reuse('shell', p, SHELL_KEYS, (q) => gableShell(q, context));
    const features: Solid[] = [];
    // Entry hole: the tip of the teardrop points down here because the box is turned over to print.
    const r = p.entryHoleDiameterMm / 2;
    const tipBelow = TEARDROP_TIP_RADII * r;
    // parseParams has checked the entry against gableFrame's limit, so the hole sits exactly where asked.
    const holeCentreZ = floorZ + p.holeAboveFloorMm + tipBelow;
    const hole = Solid.prism(
      teardropOutline(p.entryHoleDiameterMm, context.pick(HOLE_SEGMENTS, 12), false),
      'y',
      frontY - 1,
      -D / 2 + 1,
    ).translate(0, 0, holeCentreZ);
    if (p.perch) {
      // Tip up when upright = V underside when printed roof-down, so the dowel needs no support. It ends 1 mm into
      // the front wall, well short of the cavity.
      const perchZ = holeCentreZ - tipBelow - 18;
      features.push(
        Solid.prism(teardropOutline(10, context.pick(24, 8), true, Math.SQRT2), 'y', frontY - 30, frontY + 1).translate(
          0,
          0,
          perchZ,
        ),
      );
    }
    const box = shell
      .add(...features)
      .subtract(hole)
      .rotate(0, 180, 0)
      .onPlate();
    const plug = context
      .reuse('floor-plug', p, PLUG_KEYS, (q) => gablePlug(q, context))
      .translate(eaveX + 10 + Wo / 2, 0, 0);

    return {
      parts: [
        { name: 'body', mesh: partMesh(box) },
        { name: 'floor-plug', mesh: partMesh(plug) },
      ],
      facts: {
        entryHoleDiameterMm: p.entryHoleDiameterMm,
        floorWidthMm: W,
        floorDepthMm: D,
        cavityDepthMm: p.cavityDepthMm,
        holeAboveFloorMm: p.holeAboveFloorMm,
        wallThicknessMm: t,
        hasPerch: p.perch,
        drainageHoleCount: p.drainageHoles,
        ventilationAreaMm2: 2 * p.ventilationSlots * slotAreaMm2(SLOT_WIDTH_MM, SLOT_LENGTH_MM),
        cleaningAccess: true,
        chambers: 1,
      },
    };
  },
};
