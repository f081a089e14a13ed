/**
 * The neutral mesh that crosses workers, HTTP and the viewer: an indexed triangle list in millimetres,
 * wound counter-clockwise seen from outside (right-hand rule, normals point out).
 */
export interface IndexedMesh {
  /** x, y, z per vertex. */
  positions: Float32Array;
  /** Three vertex indices per triangle. */
  indices: Uint32Array;
}
