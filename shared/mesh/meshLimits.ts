/** Largest number of triangles a mesh file may hold (keeps one analysis within memory and time). */
export const MAX_MESH_TRIANGLES = 5_000_000;
/** Largest mesh file accepted, in bytes (256 MiB). */
export const MAX_MESH_FILE_BYTES = 256 * 1024 * 1024;
