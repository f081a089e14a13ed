/**
 * The shop's view of the catalogue: one product per published family, its published variants priced with VAT from
 * the settings, the key figures, birds, mounting and cautions. Only variants priced in the shop currency are sold.
 */
import { assembledSizeMm } from '../../shared/analysis/plateRule';
import { assessBirdFit } from '../../shared/birdfit/assessBirdFit';
import type { CatalogueVariant } from '../../shared/schemas/catalogue';
import type { Photo } from '../../shared/schemas/photo';
import type { SalesSettings } from '../../shared/schemas/sales';
import type { Material } from '../../shared/schemas/production';
import { loadMaterials } from './familyProduction';
import type { Region } from '../../shared/schemas/birdfit';
import type {
  ShopAxis,
  ShopBird,
  ShopPriceDisplay,
  ShopProduct,
  ShopProductList,
  ShopProductQuery,
  ShopProductSummary,
  ShopRegionCaution,
  ShopVariant,
} from '../../shared/schemas/shop';
import type { SellableVariant } from '../../shared/shop/priceCart';
import { shopUnitPrice } from '../../shared/shop/priceCart';
import type { AppContext } from '../context';
import { listCatalogueVariants } from './catalogue';
import { cachedCatalogueValue } from './catalogueCache';
import { getSalesSettings } from './salesSettings';
import { backFit, productName } from './specSheet';
import { variantCautions } from './specSheetCautions';
import { inches, writtenDecimals } from '../../shared/format';

/**
 * A family's address in the shop: its name in lower case with hyphens.
 * @param name - the family name
 */
export function productSlug(name: string): string {
  return (
    name
      .toLowerCase()
      .normalize('NFKD')
      .replace(/[^a-z0-9]+/g, '-')
      .replace(/^-+|-+$/g, '')
      .slice(0, 80) || 'product'
  );
}

/** Published variants by product, the sales settings and the studio's materials (for colour and material names). */
interface Sellable {
  groups: Map<string, CatalogueVariant[]>;
  settings: SalesSettings;
  materials: ReadonlyMap<string, Material>;
}

/**
 * Published variants in the shop currency, grouped by product slug, with the settings; kept until the catalogue or
 * the settings change (read-only).
 */
function sellable(ctx: AppContext): Promise<Sellable> {
  return cachedCatalogueValue(ctx, 'shop-sellable', () => loadSellable(ctx));
}

async function loadSellable(ctx: AppContext): Promise<Sellable> {
  const { settings } = await getSalesSettings(ctx.db);
  const groups = new Map<string, CatalogueVariant[]>();
  for (const variant of await listCatalogueVariants(ctx)) {
    if (variant.currency !== settings.shop.currency) continue;
    const slug = productSlug(variant.family.name);
    groups.set(slug, [...(groups.get(slug) ?? []), variant]);
  }
  return { groups, settings, materials: await loadMaterials(ctx.db) };
}

function priceDisplay(settings: SalesSettings): ShopPriceDisplay {
  return {
    currency: settings.shop.currency,
    vatRatePct: settings.shop.vatRatePct,
    showPricesWithVat: settings.shop.showPricesWithVat,
  };
}

function colourOf(
  variant: CatalogueVariant,
  materials: ReadonlyMap<string, Material>,
): { id: string; name: string; hex: string } | null {
  if (!variant.attributes.colour) return null;
  const material = materials.get(variant.attributes.material);
  const colour = material?.colours.find((c) => c.id === variant.attributes.colour);
  return {
    id: variant.attributes.colour,
    name: colour?.name ?? variant.attributes.colour,
    hex: colour?.hex ?? '#cccccc',
  };
}

function birdsOf(variant: CatalogueVariant): string[] {
  return suitsOf(variant).map((s) => s.name);
}

function suitsOf(variant: CatalogueVariant): ShopBird[] {
  return assessBirdFit(variant.report.facts).suits.map((s) => ({ name: s.commonName, region: s.region }));
}

/** Words for the regions of the species tables. */
const REGION_NAMES: Record<Region, string> = { 'north-america': 'North America', europe: 'Europe' };

/**
 * Cautions for species the entry admits that are introduced in a region (house sparrows and starlings in North
 * America): the bird-fit warnings of that kind, each ending with the deferral to local rules and experts.
 */
function regionCautionsOf(variant: CatalogueVariant): ShopRegionCaution[] {
  const unwanted = new Set(['admits-house-sparrows', 'admits-starlings']);
  return assessBirdFit(variant.report.facts)
    .warnings.filter((w) => w.region && w.severity !== 'info' && unwanted.has(w.code))
    .map((w) => ({
      region: w.region!,
      text:
        `In ${REGION_NAMES[w.region!]}: ${w.message} ` +
        'Where a species is introduced, follow local rules and the advice of local bird groups before putting the box up.',
    }));
}

/**
 * The outside size of the assembled product: its body (the largest printed part; templates build it first), or
 * the laid-out print when the variant was computed before part sizes were kept.
 */
function sizeOf(variant: CatalogueVariant): Pick<ShopVariant, 'sizeMm' | 'sizeKind' | 'partCount'> {
  const parts = variant.report.partSizesMm;
  const partCount = Math.max(1, parts?.length ?? variant.report.partCount);
  if (!parts?.length) return { sizeMm: variant.report.bboxSizeMm, sizeKind: 'as_printed', partCount };
  return { sizeMm: assembledSizeMm(parts, variant.report.bboxSizeMm), sizeKind: 'assembled', partCount };
}

function toShopVariant(
  variant: CatalogueVariant,
  settings: SalesSettings,
  materials: ReadonlyMap<string, Material>,
): ShopVariant {
  const size = sizeOf(variant);
  const material = materials.get(variant.attributes.material);
  return {
    sku: variant.sku,
    productName: productName(variant),
    axisValues: variant.axisValues,
    colour: colourOf(variant, materials),
    material: material?.name ?? variant.attributes.material,
    priceMinor: shopUnitPrice(variant.priceCents, settings.shop.vatRatePct),
    entryHoleMm: variant.report.facts.entryHoleDiameterMm,
    ...size,
    massG: variant.report.massG,
    birds: birdsOf(variant),
    suits: suitsOf(variant),
    regionCautions: regionCautionsOf(variant),
    mounting: backFit(variant.templateId, variant.params, size.sizeMm[0]),
    cautions: variantCautions(variant, materials).map(({ title, text }) => ({ title, text })),
    meshSha256: variant.sha256 ?? '',
  };
}

function shopPhoto(photo: Photo) {
  return {
    url: `/api/shop/photos/${photo.id}`,
    thumbUrl: `/api/shop/photos/${photo.id}/thumb`,
    caption: photo.caption,
    widthPx: photo.widthPx,
    heightPx: photo.heightPx,
  };
}

function axisLabelOf(key: string): string {
  if (key === 'entryHoleDiameterMm') return 'Entry hole';
  const words = key
    .replace(/(Mm|Deg|Pct|Style)$/, '')
    .replace(/([A-Z])/g, ' $1')
    .toLowerCase();
  return words.charAt(0).toUpperCase() + words.slice(1);
}

function valueLabel(key: string, value: unknown, colourName?: string): string {
  if (colourName) return colourName;
  if (typeof value === 'boolean') return value ? 'Yes' : 'No';
  if (typeof value === 'number')
    return key.endsWith('Mm') ? `${value} mm (${inches(value, writtenDecimals(value))} in)` : String(value);
  const text = String(value).replace(/-/g, ' ');
  return text.charAt(0).toUpperCase() + text.slice(1);
}

/** The axes of a product from its variants' axis values (only values some published variant has). */
function axesOf(variants: CatalogueVariant[], materials: ReadonlyMap<string, Material>): ShopAxis[] {
  const keys = [...new Set(variants.flatMap((v) => Object.keys(v.axisValues)))];
  return keys.map((key) => {
    const seen = new Map<string, ShopAxis['values'][number]>();
    for (const variant of variants) {
      const value = variant.axisValues[key];
      if (value === undefined || seen.has(JSON.stringify(value))) continue;
      const colour = key === 'colour' ? colourOf(variant, materials) : null;
      seen.set(JSON.stringify(value), {
        value,
        label: valueLabel(key, value, colour?.name),
        swatchHex: colour?.hex ?? null,
      });
    }
    const values = [...seen.values()].sort((a, b) =>
      typeof a.value === 'number' && typeof b.value === 'number' ? a.value - b.value : 0,
    );
    return { key, label: axisLabelOf(key), values };
  });
}

function uniqueBirds(birds: ShopBird[]): ShopBird[] {
  const seen = new Map(birds.map((b) => [`${b.region}:${b.name}`, b]));
  return [...seen.values()].sort((a, b) => a.region.localeCompare(b.region) || a.name.localeCompare(b.name));
}

function summaryOf(
  slug: string,
  variants: CatalogueVariant[],
  settings: SalesSettings,
  materials: ReadonlyMap<string, Material>,
): ShopProductSummary {
  const first = variants[0];
  const colours = new Map<string, { id: string; name: string; hex: string }>();
  for (const v of variants) {
    const c = colourOf(v, materials);
    if (c) colours.set(c.id, c);
  }
  return {
    slug,
    name: first.family.name,
    description: first.family.description,
    fromPriceMinor: Math.min(...variants.map((v) => shopUnitPrice(v.priceCents, settings.shop.vatRatePct))),
    colours: [...colours.values()],
    birds: [...new Set(variants.flatMap(birdsOf))].sort(),
    suits: uniqueBirds(variants.flatMap(suitsOf)),
    cautionRegions: [...new Set(variants.flatMap(regionCautionsOf).map((c) => c.region))].sort(),
    photo: first.photos[0] ? shopPhoto(first.photos[0]) : null,
    variantCount: variants.length,
  };
}

/**
 * The products on sale, filtered by a bird it suits and a colour it comes in.
 * @param ctx - app context
 * @param query - filters
 */
export async function listShopProducts(ctx: AppContext, query: ShopProductQuery = {}): Promise<ShopProductList> {
  const { groups, settings, materials } = await sellable(ctx);
  const all = [...groups.entries()].map(([slug, variants]) => summaryOf(slug, variants, settings, materials));
  const colours = new Map(all.flatMap((p) => p.colours).map((c) => [c.id, c]));
  return {
    products: all.filter(
      (p) =>
        (!query.bird || p.birds.includes(query.bird)) &&
        (!query.colour || p.colours.some((c) => c.id === query.colour)),
    ),
    prices: priceDisplay(settings),
    facets: { birds: [...new Set(all.flatMap((p) => p.birds))].sort(), colours: [...colours.values()] },
  };
}

/**
 * One product with its published variants, or undefined.
 * @param ctx - app context
 * @param slug - the product's address
 */
export async function getShopProduct(ctx: AppContext, slug: string): Promise<ShopProduct | undefined> {
  const { groups, settings, materials } = await sellable(ctx);
  const variants = groups.get(slug);
  if (!variants) return undefined;
  const summary = summaryOf(slug, variants, settings, materials);
  return {
    slug: summary.slug,
    name: summary.name,
    description: summary.description,
    fromPriceMinor: summary.fromPriceMinor,
    colours: summary.colours,
    birds: summary.birds,
    suits: summary.suits,
    cautionRegions: summary.cautionRegions,
    variantCount: summary.variantCount,
    axes: axesOf(variants, materials),
    variants: variants.map((v) => toShopVariant(v, settings, materials)),
    photos: variants[0].photos.map(shopPhoto),
    prices: priceDisplay(settings),
  };
}

/**
 * The sellable variants for some SKUs (published, in the shop currency), by SKU, with the settings.
 * @param ctx - app context
 * @param skus - the SKUs asked for
 */
export async function sellableVariants(
  ctx: AppContext,
  skus: string[],
): Promise<{ bySku: Map<string, SellableVariant>; settings: SalesSettings }> {
  const { settings } = await getSalesSettings(ctx.db);
  const bySku = new Map<string, SellableVariant>();
  for (const variant of await listCatalogueVariants(ctx, { skus })) {
    if (variant.currency !== settings.shop.currency || !variant.sha256) continue;
    bySku.set(variant.sku, {
      sku: variant.sku,
      productName: productName(variant),
      unitNetMinor: variant.priceCents,
      meshSha256: variant.sha256,
      // The parcel holds the assembled product (the plug sits in the body), not the print layout.
      sizeMm: assembledSizeMm(variant.report.partSizesMm, variant.report.bboxSizeMm),
      massG: variant.report.massG,
    });
  }
  return { bySku, settings };
}

/**
 * True when a photo belongs to a family that is on sale (the shop serves only those).
 * @param ctx - app context
 * @param photoId - the photo
 */
export async function isShopPhoto(ctx: AppContext, photoId: string): Promise<boolean> {
  const { groups } = await sellable(ctx);
  return [...groups.values()].some((variants) => variants[0].photos.some((p) => p.id === photoId));
}
