import {
  ArrowHelper,
  BoxGeometry,
  BufferGeometry,
  Color,
  EdgesGeometry,
  Float32BufferAttribute,
  Group,
  LineBasicMaterial,
  LineSegments,
  Mesh,
  MeshBasicMaterial,
  PlaneGeometry,
  Vector3,
} from 'three';
import { PALETTE, paletteNumber } from '../../styles/palette';

/** The printer's build volume in millimetres (x by y on the plate, z up). */
export interface BuildVolumeMm {
  widthMm: number;
  depthMm: number;
  heightMm: number;
}

/**
 * The build plate as the viewer draws it: a tinted plate with a 10 mm grid, its outline, a faint outline of the
 * build volume and an arrow that points in the build direction (+z, the direction layers stack).
 * The plate's centre is the origin; z = 0 is the plate surface.
 * @param volume - the printer's build volume
 */
export function createBuildPlate(volume: BuildVolumeMm): Group {
  const group = new Group();
  group.name = 'build-plate';
  const { widthMm, depthMm, heightMm } = volume;

  const plate = new Mesh(
    new PlaneGeometry(widthMm, depthMm),
    new MeshBasicMaterial({ color: new Color(PALETTE.plate), transparent: true, opacity: 0.85, depthWrite: false }),
  );
  plate.position.z = -0.05;
  plate.renderOrder = -1;
  group.add(plate);

  const gridPoints: number[] = [];
  const stepMm = 10;
  for (let x = -widthMm / 2; x <= widthMm / 2 + 1e-6; x += stepMm)
    gridPoints.push(x, -depthMm / 2, 0, x, depthMm / 2, 0);
  for (let y = -depthMm / 2; y <= depthMm / 2 + 1e-6; y += stepMm)
    gridPoints.push(-widthMm / 2, y, 0, widthMm / 2, y, 0);
  const gridGeometry = new BufferGeometry();
  gridGeometry.setAttribute('position', new Float32BufferAttribute(gridPoints, 3));
  group.add(
    new LineSegments(
      gridGeometry,
      new LineBasicMaterial({ color: PALETTE.lineStrong, transparent: true, opacity: 0.7 }),
    ),
  );

  const outline = new LineSegments(
    new EdgesGeometry(new PlaneGeometry(widthMm, depthMm)),
    new LineBasicMaterial({ color: PALETTE.plateEdge }),
  );
  outline.position.z = 0.02;
  group.add(outline);

  const volumeBox = new LineSegments(
    new EdgesGeometry(new BoxGeometry(widthMm, depthMm, heightMm)),
    new LineBasicMaterial({ color: PALETTE.plateVolume, transparent: true, opacity: 0.35 }),
  );
  volumeBox.name = 'build-volume';
  volumeBox.position.z = heightMm / 2;
  group.add(volumeBox);

  const arrowLengthMm = Math.min(heightMm, Math.max(widthMm, depthMm)) * 0.35;
  const arrow = new ArrowHelper(
    new Vector3(0, 0, 1),
    new Vector3(-widthMm / 2 + 12, -depthMm / 2 + 12, 0),
    arrowLengthMm,
    paletteNumber('buildArrow'),
    arrowLengthMm * 0.18,
    arrowLengthMm * 0.1,
  );
  arrow.name = 'build-direction';
  group.add(arrow);
  return group;
}
