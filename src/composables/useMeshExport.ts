import { ref } from 'vue';
import { writeStl } from '../../shared/mesh/writeStl';
import { write3mf } from '../../shared/mesh/write3mf';
import { exportFromServer, type ExportFormat } from '../api/exports';
import type { DesignParams } from '../stores/design';
import type { GeometryResult } from './useGeometryWorker';
import { downloadBlob, exportFileName } from './downloadBlob';

const MIME: Record<ExportFormat, string> = {
  stl: 'model/stl',
  '3mf': 'model/3mf',
};

/**
 * STL and 3MF downloads of the design: written in the browser from the worker's mesh, or built by the server
 * (`POST /api/exports`) whose `X-Mesh-Sha256` proves both paths made the same mesh.
 */
export function useMeshExport() {
  const serverBusy = ref(false);
  /** Hash the server reported for its last export. */
  const serverHash = ref<string | null>(null);

  /**
   * Writes the previewed mesh as a file and offers it for download.
   * @param result - the worker's latest result
   * @param format - stl (binary) or 3mf (millimetres)
   * @param templateId - for the file name
   * @param presetName - for the file name
   */
  function downloadFromBrowser(
    result: GeometryResult,
    format: ExportFormat,
    templateId: string,
    presetName: string | null,
  ): void {
    const bytes = format === 'stl' ? writeStl(result.mesh) : write3mf(result.mesh);
    const blob = new Blob([bytes as Uint8Array<ArrayBuffer>], { type: MIME[format] });
    downloadBlob(blob, exportFileName(templateId, presetName, result.sha256, format));
  }

  /**
   * Asks the server to build the same design and downloads its file.
   * @param templateId - template id
   * @param params - parameters in millimetres
   * @param format - stl or 3mf
   */
  async function downloadFromServer(templateId: string, params: DesignParams, format: ExportFormat): Promise<void> {
    serverBusy.value = true;
    try {
      const file = await exportFromServer({ templateId, params, format });
      serverHash.value = file.sha256;
      downloadBlob(file.blob, file.fileName);
    } finally {
      serverBusy.value = false;
    }
  }

  return { serverBusy, serverHash, downloadFromBrowser, downloadFromServer };
}
