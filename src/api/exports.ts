import { ApiErrorSchema } from '../../shared/schemas/error';
import { ApiError } from './ApiError';

/** File formats the export endpoint writes. */
export type ExportFormat = 'stl' | '3mf';

/** A file exported by the server, with the content hash it reported. */
export interface ServerExport {
  blob: Blob;
  /** sha256 of the mesh content (hex) from the `X-Mesh-Sha256` header; null when the server did not send it. */
  sha256: string | null;
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
}): Promise<ServerExport> {
  let res: Response;
  try {
    res = await fetch('/api/exports', {
      method: 'POST',
      headers: { 'Content-Type': 'application/json' },
      body: JSON.stringify(body),
      credentials: 'same-origin',
    });
  } catch {
    throw new ApiError(0, 'network', 'The server could not be reached. Check your connection and try again.');
  }
  if (!res.ok) {
    const parsed = ApiErrorSchema.safeParse(await res.json().catch(() => null));
    if (parsed.success) {
      const { code, message, details } = parsed.data.error;
      throw new ApiError(res.status, code, message, details);
    }
    throw new ApiError(res.status, 'http_error', `The server answered HTTP ${res.status}.`);
  }
  const disposition = res.headers.get('Content-Disposition') ?? '';
  const named = /filename="?([^";]+)"?/.exec(disposition)?.[1];
  return {
    blob: await res.blob(),
    sha256: res.headers.get('X-Mesh-Sha256'),
    fileName: named ?? `${body.templateId}.${body.format}`,
  };
}
