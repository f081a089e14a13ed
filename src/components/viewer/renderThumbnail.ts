import { Box3, Vector2, Vector3, type Object3D, type PerspectiveCamera, type Scene, type WebGLRenderer } from 'three';

/** What {@link renderThumbnail} draws with: the viewer's renderer, scene and camera. */
export interface ThumbnailStage {
  renderer: WebGLRenderer;
  scene: Scene;
  camera: PerspectiveCamera;
  /** The point the camera orbits round (the view direction is kept). */
  target: Vector3;
  /** What the thumbnail frames: the model, or the whole scene when there is none. */
  framed: Object3D;
  /** Hidden while the thumbnail is drawn (the build-volume outline), if any. */
  hidden?: Object3D;
}

/**
 * Renders the stage into a small image (for preset thumbnails): same viewing direction as the person's view, framed
 * on the model at the thumbnail's aspect ratio, then the live view is drawn again at its own size.
 * @param stage - renderer, scene, camera and what to frame
 * @param widthPx - thumbnail width in pixels
 * @param heightPx - thumbnail height in pixels
 * @param capture - reads the canvas right after the thumbnail is drawn (e.g. into a PNG data URL)
 * @returns what `capture` returned
 */
export function renderThumbnail<T>(stage: ThumbnailStage, widthPx: number, heightPx: number, capture: () => T): T {
  const { renderer: r, scene, camera } = stage;
  const shot = camera.clone();
  shot.aspect = widthPx / heightPx;
  const box = new Box3().setFromObject(stage.framed);
  const centre = box.getCenter(new Vector3());
  const radius = Math.max(box.getSize(new Vector3()).length() / 2, 10);
  const direction = camera.position.clone().sub(stage.target).normalize();
  const fitFov = Math.min(
    shot.fov,
    (2 * Math.atan(Math.tan((shot.fov * Math.PI) / 360) * shot.aspect) * 180) / Math.PI,
  );
  const distance = (radius / Math.sin((fitFov * Math.PI) / 360)) * 1.02;
  shot.position.copy(centre).addScaledVector(direction, distance);
  shot.near = distance / 100;
  shot.far = distance * 20;
  shot.lookAt(centre);
  shot.updateProjectionMatrix();

  const previous = r.getSize(new Vector2());
  const previousRatio = r.getPixelRatio();
  if (stage.hidden) stage.hidden.visible = false;
  r.setPixelRatio(1);
  r.setSize(widthPx, heightPx, false);
  r.render(scene, shot);
  // Read back in the same task: the drawing buffer is still intact without preserveDrawingBuffer.
  const url = capture();
  if (stage.hidden) stage.hidden.visible = true;
  r.setPixelRatio(previousRatio);
  r.setSize(previous.x, previous.y, false);
  r.render(scene, camera);
  return url;
}
