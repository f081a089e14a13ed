/** Why a mesh file was refused; stable codes the API and CLI can show. */
export type MeshFormatReason = 'empty' | 'truncated' | 'triangle_count' | 'non_finite' | 'too_large' | 'not_a_mesh';

/** A mesh file that cannot be read, with a machine code and a sentence a person can act on. */
export class MeshFormatError extends Error {
  /** Machine-readable reason. */
  readonly reason: MeshFormatReason;

  /**
   * @param reason - machine-readable reason code
   * @param message - a sentence that says what is wrong with the file
   */
  constructor(reason: MeshFormatReason, message: string) {
    super(message);
    this.name = 'MeshFormatError';
    this.reason = reason;
  }
}
