import { CustomerOrderSchema, type CustomerOrder } from '../../shared/schemas/order';
import {
  CheckoutResponseSchema,
  ShopProductListSchema,
  ShopProductSchema,
  ShopQuoteSchema,
  type CheckoutRequest,
  type CheckoutResponse,
  type ShopProduct,
  type ShopProductList,
  type ShopProductQuery,
  type ShopQuote,
  type ShopQuoteRequest,
} from '../../shared/schemas/shop';
import { StudioFactsSchema, type StudioFacts } from '../../shared/schemas/studioFacts';
import { api } from './client';

/** The studio's name, for the shop's header, and the locale its prices are written in. */
export function getShopStudio(): Promise<StudioFacts> {
  return api('/shop/studio', { schema: StudioFactsSchema });
}

/**
 * Products on sale, filtered by bird and colour.
 * @param query - filters
 */
export function listShopProducts(query: ShopProductQuery = {}): Promise<ShopProductList> {
  const params = new URLSearchParams(Object.entries(query).filter((entry): entry is [string, string] => !!entry[1]));
  const suffix = params.size ? `?${params}` : '';
  return api(`/shop/products${suffix}`, { schema: ShopProductListSchema });
}

/** One product with its variants. @param slug - the product's address */
export function getShopProduct(slug: string): Promise<ShopProduct> {
  return api(`/shop/products/${encodeURIComponent(slug)}`, { schema: ShopProductSchema });
}

/** The server's price of a cart for a country. @param body - items and country */
export function quoteCart(body: ShopQuoteRequest): Promise<ShopQuote> {
  return api('/shop/quote', { method: 'POST', body, schema: ShopQuoteSchema });
}

/** Starts a checkout; the answer holds the payment page to go to. @param body - e-mail, address and items */
export function startCheckout(body: CheckoutRequest): Promise<CheckoutResponse> {
  return api('/shop/checkout', { method: 'POST', body, schema: CheckoutResponseSchema });
}

/** The customer's order behind a private link. @param token - the secret from the link */
export function customerOrder(token: string): Promise<CustomerOrder> {
  return api(`/shop/orders/${encodeURIComponent(token)}`, { schema: CustomerOrderSchema });
}
