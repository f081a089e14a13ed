import { strToU8, zipSync } from 'fflate';
import type { IndexedMesh } from '../schemas/mesh';

/** The 3MF core namespace (source: 3MF Core Specification, via trade-facts §6). */
export const THREEMF_CORE_NAMESPACE = 'http://schemas.microsoft.com/3dmanufacturing/core/2015/02';

/** Options for {@link write3mf}. */
export interface Write3mfOptions {
  /** Model unit; our meshes are in millimetres, the 3MF default. */
  unit?: 'millimeter';
  /** Object name shown by slicing software. */
  name?: string;
}

const CONTENT_TYPES =
  '<?xml version="1.0" encoding="UTF-8"?>\n' +
  '<Types xmlns="http://schemas.openxmlformats.org/package/2006/content-types">' +
  '<Default Extension="rels" ContentType="application/vnd.openxmlformats-package.relationships+xml"/>' +
  '<Default Extension="model" ContentType="application/vnd.ms-package.3dmanufacturing-3dmodel+xml"/>' +
  '</Types>';

const RELS =
  '<?xml version="1.0" encoding="UTF-8"?>\n' +
  '<Relationships xmlns="http://schemas.openxmlformats.org/package/2006/relationships">' +
  '<Relationship Target="/3D/3dmodel.model" Id="rel0" ' +
  'Type="http://schemas.microsoft.com/3dmanufacturing/2013/01/3dmodel"/>' +
  '</Relationships>';

function escapeXml(text: string): string {
  return text.replace(/[<>&"']/g, (ch) => `&#${ch.charCodeAt(0)};`);
}

/** Shortest decimal that reads back as the same float32 (keeps the file small and the mesh exact). */
function formatCoordinate(value: number): string {
  const single = Math.fround(value);
  for (let digits = 6; digits < 9; digits++) {
    const text = single.toPrecision(digits);
    if (Math.fround(Number(text)) === single) return String(Number(text));
  }
  return String(Number(single.toPrecision(9)));
}

/**
 * Writes a 3MF package (OPC zip: [Content_Types].xml, _rels/.rels, 3D/3dmodel.model) holding the mesh as one object
 * of type "model" in millimetres. Triangles keep the mesh's outward winding, as the 3MF core spec requires.
 * @param mesh - a validated, outward-wound mesh in millimetres
 * @param options - unit (millimetre only) and object name
 */
export function write3mf(mesh: IndexedMesh, options: Write3mfOptions = {}): Uint8Array {
  const unit = options.unit ?? 'millimeter';
  const name = escapeXml(options.name ?? 'Nestwright design');
  const { positions, indices } = mesh;
  const vertices: string[] = [];
  for (let i = 0; i < positions.length; i += 3) {
    vertices.push(
      `<vertex x="${formatCoordinate(positions[i])}" y="${formatCoordinate(positions[i + 1])}" z="${formatCoordinate(positions[i + 2])}"/>`,
    );
  }
  const triangles: string[] = [];
  for (let i = 0; i < indices.length; i += 3) {
    triangles.push(`<triangle v1="${indices[i]}" v2="${indices[i + 1]}" v3="${indices[i + 2]}"/>`);
  }
  const model =
    '<?xml version="1.0" encoding="UTF-8"?>\n' +
    `<model unit="${unit}" xml:lang="en-GB" xmlns="${THREEMF_CORE_NAMESPACE}">` +
    '<resources>' +
    `<object id="1" name="${name}" type="model"><mesh>` +
    `<vertices>${vertices.join('')}</vertices>` +
    `<triangles>${triangles.join('')}</triangles>` +
    '</mesh></object>' +
    '</resources>' +
    '<build><item objectid="1"/></build>' +
    '</model>';
  return zipSync(
    {
      '[Content_Types].xml': strToU8(CONTENT_TYPES),
      '_rels/.rels': strToU8(RELS),
      '3D/3dmodel.model': strToU8(model),
    },
    { level: 6, mtime: new Date('2000-01-01T00:00:00Z') },
  );
}
