/**
 * Speed of the sales documents for each template's default variant: building the upright body, the three-view
 * drawing (silhouettes, creases and the hidden-line rays), the shaded view, and the whole two-page spec sheet PDF;
 * and the price list for 500 rows as CSV and XLSX. A family sheet is about one spec sheet per variant.
 */
import { orthographicDrawing } from '../shared/drawing/orthographicDrawing';
import { shadedViewSvg } from '../shared/drawing/shadedViewSvg';
import { productMesh } from '../server/services/specSheetMesh';
import { renderSpecSheets } from '../server/services/specSheet';
import { DEFAULT_SALES_SETTINGS } from '../server/services/salesSettings';
import { priceListCsv, priceListRows, priceListXlsx } from '../server/services/priceList';
import { catalogueVariantFixture } from '../tests/salesFixtures';
import { DEFAULT_MATERIALS } from '../shared/production/defaults';

/** The seed materials, as a new database holds them. */
const MATERIALS = new Map(DEFAULT_MATERIALS.map((m) => [m.id, m]));
import { TEMPLATES } from '../templates/index';

async function timeMs<T>(fn: () => Promise<T> | T): Promise<{ ms: number; value: T }> {
  const started = performance.now();
  const value = await fn();
  return { ms: performance.now() - started, value };
}

/** Prints per-template drawing and PDF times and the price-list times. */
export default async function bench(): Promise<void> {
  for (const template of TEMPLATES) {
    const built = await timeMs(() => productMesh(template.id, {}));
    const mesh = built.value.mesh;
    orthographicDrawing(mesh); // warm up
    const drawing = await timeMs(() => orthographicDrawing(mesh));
    const shaded = await timeMs(() => shadedViewSvg(mesh, { colourHex: '#d8c8a4' }));
    const variant = await catalogueVariantFixture({ sku: `FH-BENCH-${template.id}`, templateId: template.id });
    const pdf = await timeMs(() =>
      renderSpecSheets([variant], {
        settings: DEFAULT_SALES_SETTINGS,
        materials: MATERIALS,
        studioName: 'Fernhollow Studio',
      }),
    );
    const lines =
      drawing.value.front.visible.length / 4 +
      drawing.value.side.visible.length / 4 +
      drawing.value.top.visible.length / 4;
    console.log(
      `spec sheet ${template.id}: ${mesh.indices.length / 3} triangles; body ${built.ms.toFixed(0)} ms, ` +
        `drawing ${drawing.ms.toFixed(0)} ms (${lines} visible lines), shaded view ${shaded.ms.toFixed(0)} ms, ` +
        `PDF ${pdf.ms.toFixed(0)} ms (${(pdf.value.length / 1024).toFixed(0)} KiB)`,
    );
  }
  const one = await catalogueVariantFixture({ sku: 'FH-BENCH-1', templateId: TEMPLATES[0].id });
  const variants = Array.from({ length: 500 }, (_, i) => ({ ...one, sku: `FH-BENCH-${i}` }));
  const rows = priceListRows(variants, MATERIALS);
  const csv = await timeMs(() => priceListCsv(rows));
  const xlsx = await timeMs(() => priceListXlsx(rows, 'Fernhollow Studio'));
  console.log(
    `price list 500 rows: CSV ${csv.ms.toFixed(1)} ms (${(csv.value.length / 1024).toFixed(0)} KiB), XLSX ${xlsx.ms.toFixed(0)} ms (${(xlsx.value.length / 1024).toFixed(0)} KiB)`,
  );
}
