import { strToU8, zipSync } from 'fflate';
import type { IndexedMesh } from '../schemas/mesh';

/** The 3MF core namespace. source: 3MF Core Specification v1.3, 3MF Consortium, 2022 (§3 Model). */
export const THREEMF_CORE_NAMESPACE = 'http://schemas.microsoft.com/3dmanufacturing/core/2015/02';

/** The material and colour every part is printed in, written as the one entry of the core's base materials. */
export interface ThreeMfMaterial {
  /** e.g. "PLA, Moss green". */
  name: string;
  /** sRGB colour `#RRGGBB`. */
  displayColour: string;
}

/** Options for {@link write3mf} and {@link write3mfParts}. */
export interface Write3mfOptions {
  /** Model unit; our meshes are in millimetres, the 3MF default. */
  unit?: 'millimeter';
  /** Object name (single-object files). */
  name?: string;
  /** Material and colour of every object (base materials group); none when omitted. */
  material?: ThreeMfMaterial;
  /** Model metadata (name → value), e.g. Title, Designer; written in the core's `<metadata>` elements. */
  metadata?: Record<string, string>;
}

/** One object of a 3MF package: a named part, its mesh, and where its build item places it. */
export interface ThreeMfPart {
  /** Object name, e.g. "body" or "floor plug". */
  name: string;
  /** The part's mesh in millimetres, outward wound. */
  mesh: IndexedMesh;
  /**
   * The build item's affine transform: 12 numbers m00 m01 m02 m10 m11 m12 m20 m21 m22 m30 m31 m32 (row vectors,
   * translation last), as the core specification writes them; identity when omitted.
   */
  transform?: number[];
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

/** A transform number: at most 4 decimals, no "-0". */
function formatTransformNumber(value: number): string {
  const rounded = Math.round(value * 10_000) / 10_000;
  return String(rounded === 0 ? 0 : rounded);
}

/** `#rrggbb` → `#RRGGBBFF` (the core's sRGB colour with alpha). */
function displayColour(hex: string): string {
  const match = /^#?([0-9a-f]{6})([0-9a-f]{2})?$/i.exec(hex.trim());
  if (!match) throw new Error(`"${hex}" is not an sRGB colour #RRGGBB`);
  return `#${match[1].toUpperCase()}${(match[2] ?? 'FF').toUpperCase()}`;
}

function meshXml(mesh: IndexedMesh): string {
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
  return `<mesh><vertices>${vertices.join('')}</vertices><triangles>${triangles.join('')}</triangles></mesh>`;
}

/**
 * Writes a 3MF package holding the mesh as one object of type "model" in millimetres.
 * @param mesh - a validated, outward-wound mesh in millimetres
 * @param options - unit (millimetre only), object name, material
 */
export function write3mf(mesh: IndexedMesh, options: Write3mfOptions = {}): Uint8Array {
  return write3mfParts([{ name: options.name ?? 'Nestwright design', mesh }], options);
}

/**
 * Writes a 3MF package (OPC zip: [Content_Types].xml, _rels/.rels, 3D/3dmodel.model) with one named object per
 * part and one build item per object, placed by its transform. With a material, the resources start with a base
 * materials group of one entry (name and display colour) and every object refers to it (`pid`, `pindex`).
 * Triangles keep each mesh's outward winding, as the core specification requires.
 * source: 3MF Core Specification v1.3, 3MF Consortium, 2022 (§3.4 metadata, §4 object resources and mesh,
 * §4.1 base materials, §3.4.3 build items and transforms).
 * @param parts - the objects, in order
 * @param options - unit, material, metadata
 */
export function write3mfParts(parts: ThreeMfPart[], options: Write3mfOptions = {}): Uint8Array {
  const unit = options.unit ?? 'millimeter';
  const resources: string[] = [];
  let nextId = 1;
  let materialRef = '';
  if (options.material) {
    const groupId = nextId++;
    resources.push(
      `<basematerials id="${groupId}"><base name="${escapeXml(options.material.name)}" ` +
        `displaycolor="${displayColour(options.material.displayColour)}"/></basematerials>`,
    );
    materialRef = ` pid="${groupId}" pindex="0"`;
  }
  const items: string[] = [];
  for (const part of parts) {
    const id = nextId++;
    resources.push(
      `<object id="${id}" name="${escapeXml(part.name)}" type="model"${materialRef}>${meshXml(part.mesh)}</object>`,
    );
    const transform = part.transform ? ` transform="${part.transform.map(formatTransformNumber).join(' ')}"` : '';
    items.push(`<item objectid="${id}"${transform}/>`);
  }
  const metadata = Object.entries(options.metadata ?? {})
    .map(([name, value]) => `<metadata name="${escapeXml(name)}">${escapeXml(value)}</metadata>`)
    .join('');
  const model =
    '<?xml version="1.0" encoding="UTF-8"?>\n' +
    `<model unit="${unit}" xml:lang="en-GB" xmlns="${THREEMF_CORE_NAMESPACE}">` +
    metadata +
    `<resources>${resources.join('')}</resources>` +
    `<build>${items.join('')}</build>` +
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
