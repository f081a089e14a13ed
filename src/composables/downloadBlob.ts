/**
 * Offers a Blob to the person as a file download.
 * @param blob - the file content
 * @param fileName - suggested file name
 */
export function downloadBlob(blob: Blob, fileName: string): void {
  const url = URL.createObjectURL(blob);
  const link = document.createElement('a');
  link.href = url;
  link.download = fileName;
  link.rel = 'noopener';
  document.body.appendChild(link);
  link.click();
  link.remove();
  // Revoke later: some browsers start reading the object URL after click() returns.
  setTimeout(() => URL.revokeObjectURL(url), 10_000);
}

/**
 * A file name for an exported design: template, preset name (if any) and the first hash characters.
 * @param templateId - template id
 * @param presetName - the preset's name, or null for an unsaved design
 * @param sha256 - mesh content hash
 * @param extension - `stl` or `3mf`
 */
export function exportFileName(
  templateId: string,
  presetName: string | null,
  sha256: string,
  extension: string,
): string {
  const slug = (presetName ?? 'design')
    .toLowerCase()
    .replace(/[^a-z0-9]+/g, '-')
    .replace(/^-|-$/g, '')
    .slice(0, 40);
  return `${templateId}-${slug || 'design'}-${sha256.slice(0, 8)}.${extension}`;
}
