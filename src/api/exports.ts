import { fetchFile } from './fetchFile';

/** File formats the export endpoint writes. */
export type ExportFormat = 'stl' | '3mf';

/** A file exported by the server, with the content hash it reported. */
export interface ServerExport {
  blob: Blob;
  /** sha256 of the mesh content (hex) from the `X-Mesh-Sha256` header; null when the server did not send it. */
  meshSha256: string | null;
  /** sha256 of the file's bytes (hex) from the `X-File-Sha256` header; null when the server did not send it. */
  fileSha256: string | null;
  fileName: string;
}

/**
 * Asks the server to build and write the file (`POST /api/exports`); the answer is the file itself.
 * @param body - template, parameters in millimetres and format
 */
export async function exportFromServer(body: {
  templateId: string;
  params: Record<string, unknown>;
  format: ExportFormat;
  /** Printer whose plate a 3MF is laid out for, and the material and colour it names. */
  printerId?: string;
  materialId?: string;
  colourId?: string;
}): Promise<ServerExport> {
  const file = await fetchFile('/api/exports', {
    method: 'POST',
    headers: { 'Content-Type': 'application/json' },
    body: JSON.stringify(body),
  });
  return {
    blob: file.blob,
    meshSha256: file.headers.get('X-Mesh-Sha256'),
    fileSha256: file.headers.get('X-File-Sha256'),
    fileName: file.fileName ?? `${body.templateId}.${body.format}`,
  };
}
