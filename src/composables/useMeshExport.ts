import { ref } from 'vue';
import { writeStl } from '../../shared/mesh/writeStl';
import { design3mf, type Design3mfChoice } from '../../shared/mesh/design3mf';
import type { ProductionChoice } from '../workers/geometryProtocol';
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
   * @param production - printer (a 3MF's parts are laid on its plate), material and colour
   */
  function downloadFromBrowser(
    result: GeometryResult,
    format: ExportFormat,
    templateId: string,
    presetName: string | null,
    production: ProductionChoice,
  ): void {
    // Exports are always of the full-quality mesh; a draft (slider held) is only a preview.
    if (result.quality !== 'full' || !result.sha256)
      throw new Error('the model on screen is a draft preview; release the slider for the full-quality model.');
    const sha256 = result.sha256;
    const bytes =
      format === 'stl'
        ? writeStl(result.mesh)
        : design3mf(
            { ...result, template: { id: templateId, version: result.templateVersion } },
            plateChoice(production),
          );
    const blob = new Blob([bytes as Uint8Array<ArrayBuffer>], { type: MIME[format] });
    downloadBlob(blob, exportFileName(templateId, presetName, sha256, format));
  }

  /**
   * Asks the server to build the same design and downloads its file.
   * @param templateId - template id
   * @param params - parameters in millimetres
   * @param format - stl or 3mf
   * @param production - printer, material and colour (as for the browser's file, so both files are the same bytes)
   */
  async function downloadFromServer(
    templateId: string,
    params: DesignParams,
    format: ExportFormat,
    production: ProductionChoice,
  ): Promise<void> {
    serverBusy.value = true;
    try {
      const file = await exportFromServer({
        templateId,
        params,
        format,
        printerId: production.printer.id,
        materialId: production.material.id,
        colourId: production.colour.id,
      });
      serverHash.value = file.meshSha256;
      downloadBlob(file.blob, file.fileName);
    } finally {
      serverBusy.value = false;
    }
  }

  return { serverBusy, serverHash, downloadFromBrowser, downloadFromServer };
}

/**
 * The plate and material a 3MF is written for, from the editor's choice (the server builds the same from ids).
 * @param production - printer, material and colour
 */
export function plateChoice(production: ProductionChoice): Design3mfChoice {
  const { x, y, z } = production.printer.buildVolumeMm;
  return {
    buildVolumeMm: [x, y, z],
    material: { name: `${production.material.name}, ${production.colour.name}`, displayColour: production.colour.hex },
  };
}
