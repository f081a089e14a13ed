/**
 * What the preview draws with: the three.js renderer, scene, lights, build plate and model, on a canvas of the page or
 * on an OffscreenCanvas in the viewer worker (the same code in both places). It is driven by messages only: the page
 * keeps the camera controls and sends the camera, the size, the plate and the meshes; the stage draws on demand (at
 * most once per animation frame) and says which mesh a drawn frame showed.
 */
import {
  Color,
  DirectionalLight,
  Group,
  HemisphereLight,
  Mesh,
  MeshStandardMaterial,
  PerspectiveCamera,
  Scene,
  Vector3,
  WebGLRenderer,
} from 'three';
import type { IndexedMesh } from '../../../shared/schemas/mesh';
import { meshToBufferGeometry, updateBufferGeometry } from './meshToBufferGeometry';
import { createBuildPlate, type BuildVolumeMm } from './createBuildPlate';
import { disposeObject } from './disposeObject';
import { renderThumbnail } from './renderThumbnail';
import { PALETTE, paletteNumber } from '../../styles/palette';

/** The camera as the page's controls left it. */
export interface StageCamera {
  position: [number, number, number];
  quaternion: [number, number, number, number];
  fov: number;
  near: number;
  far: number;
}

/** Messages from the page to the stage. */
export type StageCommand =
  | { type: 'size'; widthPx: number; heightPx: number; pixelRatio: number }
  | { type: 'camera'; camera: StageCamera }
  | { type: 'plate'; volume: BuildVolumeMm }
  | {
      type: 'model';
      /** Names this mesh in the `drawn` answer. */
      token: number;
      mesh: IndexedMesh | null;
      overhangMask: Uint8Array | null;
      surfaceColour: string | null;
    }
  | { type: 'thumbnail'; id: number; widthPx: number; heightPx: number; target: [number, number, number] }
  | { type: 'dispose' };

/** Messages from the stage to the page. */
export type StageEvent =
  /** `drawnAt`: when the frame was drawn, in ms since the epoch (performance.timeOrigin + now: comparable across threads). */
  | { type: 'drawn'; token: number; drawnAt: number }
  /**
   * The frame that showed `token` has gone to the screen: the stage's next animation frame began, which happens only
   * once the drawn frame was handed on (with software WebGL that includes reading its pixels back). `presentedAt` on
   * the same clock as `drawnAt`.
   */
  | { type: 'presented'; token: number; presentedAt: number }
  | { type: 'thumbnail'; id: number; url: string | null }
  | { type: 'failed'; message: string };

/** A canvas the stage can draw on: the page's own, or one handed to a worker. */
export type StageCanvas = HTMLCanvasElement | OffscreenCanvas;

/** Schedules a callback before the next frame (a worker drawing on an OffscreenCanvas has its own). */
function nextFrame(callback: () => void): void {
  if (typeof requestAnimationFrame === 'function') requestAnimationFrame(callback);
  else setTimeout(callback, 16);
}

/** Reads a canvas just drawn into a PNG data URL (in the same task: the drawing buffer is not kept after it). */
function readPng(canvas: StageCanvas): Promise<string> {
  if ('toDataURL' in canvas) return Promise.resolve(canvas.toDataURL('image/png'));
  // The snapshot is taken when convertToBlob is called; only the encoding runs later.
  return canvas.convertToBlob({ type: 'image/png' }).then(
    (blob) =>
      new Promise<string>((resolve, reject) => {
        const reader = new FileReader();
        reader.onload = () => resolve(String(reader.result));
        reader.onerror = () => reject(reader.error ?? new Error('The thumbnail could not be read.'));
        reader.readAsDataURL(blob);
      }),
  );
}

/** Shows the part as it will be printed: resting on the plate (lowest point at z = 0), centred in x and y. */
function placeOnPlate(model: Mesh): void {
  const box = model.geometry.boundingBox!;
  model.position.set(-(box.min.x + box.max.x) / 2, -(box.min.y + box.max.y) / 2, -box.min.z);
}

/**
 * Creates the stage on a canvas; returns null (after sending `failed`) when the canvas gives no WebGL.
 * @param canvas - where to draw
 * @param send - where the stage's events go
 * @returns a function taking the page's commands
 */
export function createViewerStage(
  canvas: StageCanvas,
  send: (event: StageEvent) => void,
): ((command: StageCommand) => void) | null {
  let renderer: WebGLRenderer;
  try {
    renderer = new WebGLRenderer({ canvas, antialias: true, alpha: false });
  } catch (error) {
    send({ type: 'failed', message: error instanceof Error ? error.message : String(error) });
    return null;
  }
  renderer.setClearColor(new Color(PALETTE.stage));
  const scene = new Scene();
  const camera = new PerspectiveCamera(35, 1, 1, 5000);
  camera.up.set(0, 0, 1);
  scene.add(new HemisphereLight(paletteNumber('lightSky'), paletteNumber('lightGround'), 1.6));
  const key = new DirectionalLight(paletteNumber('lightKey'), 1.6);
  key.position.set(200, -300, 400);
  scene.add(key);
  const rim = new DirectionalLight(paletteNumber('lightRim'), 0.6);
  rim.position.set(-300, 250, 150);
  scene.add(rim);
  const modelGroup = new Group();
  modelGroup.name = 'model';
  scene.add(modelGroup);
  let plate: Group | null = null;
  /** The one model mesh while a model is shown (its buffers are reused for a mesh that fits). */
  let modelMesh: Mesh | null = null;
  let frameRequested = false;
  /** The mesh put on screen since the last frame, announced once that frame is drawn. */
  let unannounced: number | null = null;

  function requestRender(): void {
    if (frameRequested) return;
    frameRequested = true;
    nextFrame(() => {
      frameRequested = false;
      renderer.render(scene, camera);
      if (unannounced !== null) {
        const token = unannounced;
        send({ type: 'drawn', token, drawnAt: performance.timeOrigin + performance.now() });
        unannounced = null;
        nextFrame(() => send({ type: 'presented', token, presentedAt: performance.timeOrigin + performance.now() }));
      }
    });
  }

  function setModel(command: Extract<StageCommand, { type: 'model' }>): void {
    const { mesh, overhangMask } = command;
    const options = { surfaceHex: command.surfaceColour };
    unannounced = command.token;
    if (!mesh || mesh.indices.length === 0) {
      if (modelMesh) disposeObject(modelMesh);
      modelMesh = null;
    } else if (modelMesh && updateBufferGeometry(modelMesh.geometry, mesh, overhangMask, options)) {
      // Fits the buffers on screen: rewritten in place.
    } else if (modelMesh) {
      // Another size: a new geometry under the same material (a new material would compile its shaders again).
      modelMesh.geometry.dispose();
      // Spare room, so the next meshes of a drag that are a little larger still go in place.
      const room = Math.ceil((mesh.indices.length / 3) * 1.25);
      modelMesh.geometry = meshToBufferGeometry(mesh, overhangMask, options, room);
    } else {
      const geometry = meshToBufferGeometry(mesh, overhangMask, options);
      const material = new MeshStandardMaterial({
        vertexColors: true,
        flatShading: true,
        roughness: 0.82,
        metalness: 0,
      });
      modelMesh = new Mesh(geometry, material);
      modelGroup.add(modelMesh);
    }
    if (modelMesh) placeOnPlate(modelMesh);
    requestRender();
  }

  function thumbnail(command: Extract<StageCommand, { type: 'thumbnail' }>): void {
    const framed = modelGroup.children.length > 0 ? modelGroup : scene;
    const hidden = plate?.getObjectByName('build-volume');
    const target = new Vector3(...command.target);
    const stage = { renderer, scene, camera, target, framed, hidden };
    let reading: Promise<string>;
    try {
      reading = renderThumbnail(stage, command.widthPx, command.heightPx, () => readPng(canvas));
    } catch {
      reading = Promise.reject(new Error('no thumbnail'));
    }
    reading.then(
      (url) => send({ type: 'thumbnail', id: command.id, url }),
      () => send({ type: 'thumbnail', id: command.id, url: null }),
    );
  }

  return (command) => {
    switch (command.type) {
      case 'size':
        renderer.setPixelRatio(command.pixelRatio);
        // A page canvas is sized by its own style sheet; an OffscreenCanvas has no style.
        renderer.setSize(command.widthPx, command.heightPx, false);
        camera.aspect = command.widthPx / command.heightPx;
        camera.updateProjectionMatrix();
        break;
      case 'camera':
        camera.position.set(...command.camera.position);
        camera.quaternion.set(...command.camera.quaternion);
        camera.fov = command.camera.fov;
        camera.near = command.camera.near;
        camera.far = command.camera.far;
        camera.updateProjectionMatrix();
        break;
      case 'plate':
        if (plate) disposeObject(plate);
        plate = createBuildPlate(command.volume);
        scene.add(plate);
        break;
      case 'model':
        setModel(command);
        return;
      case 'thumbnail':
        thumbnail(command);
        return;
      case 'dispose':
        disposeObject(modelGroup);
        if (plate) disposeObject(plate);
        renderer.dispose();
        return;
    }
    requestRender();
  };
}
