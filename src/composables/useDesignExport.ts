import type { Ref } from 'vue';
import { useMessage } from 'naive-ui';
import type { ExportFormat } from '../api/exports';
import { useDesignStore } from '../stores/design';
import type { ProductionChoice } from '../workers/geometryProtocol';
import type { GeometryResult } from './useGeometryWorker';
import { useMeshExport } from './useMeshExport';

/**
 * The editor's export flow: the open design's STL or 3MF written in the browser from the previewed mesh, or built
 * by the server and its mesh hash compared with the preview's; failures and the comparison are told as messages.
 * @param result - the preview's latest result
 * @param productionChoice - printer, material and colour the file is written for
 * @returns the server's busy flag and hash, and the two download actions
 */
export function useDesignExport(result: Ref<GeometryResult | null>, productionChoice: Ref<ProductionChoice | null>) {
  const message = useMessage();
  const design = useDesignStore();
  const meshExport = useMeshExport();

  async function exportBrowser(format: ExportFormat): Promise<void> {
    if (!result.value || !design.templateId || !productionChoice.value) return;
    try {
      meshExport.downloadFromBrowser(
        result.value,
        format,
        design.templateId,
        design.preset?.name ?? null,
        productionChoice.value,
      );
    } catch (err) {
      message.error(
        `The ${format.toUpperCase()} file could not be written: ${err instanceof Error ? err.message : String(err)}`,
      );
    }
  }

  async function exportServer(format: ExportFormat): Promise<void> {
    if (!design.templateId || !productionChoice.value) return;
    try {
      await meshExport.downloadFromServer(design.templateId, design.params, format, productionChoice.value);
      if (meshExport.serverHash.value && result.value) {
        if (meshExport.serverHash.value === result.value.sha256)
          message.success('Server export matches the preview mesh.');
        else message.warning('The server built a different mesh from the preview: check the template versions.');
      }
    } catch (err) {
      message.error(err instanceof Error ? err.message : String(err));
    }
  }

  return { serverBusy: meshExport.serverBusy, serverHash: meshExport.serverHash, exportBrowser, exportServer };
}
