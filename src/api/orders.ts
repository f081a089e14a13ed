import {
  OrderDetailSchema,
  OrderListResponseSchema,
  type OrderCancelRequest,
  type OrderClearFlagRequest,
  type OrderDetail,
  type OrderListResponse,
  type OrderTransitionRequest,
} from '../../shared/schemas/order';
import { api } from './client';

/** Query of the order list as the screen builds it. */
export interface OrderListParams {
  state?: string;
  q?: string;
  flagged?: boolean;
  page: number;
  pageSize: number;
}

/** The query string of a list or export. @param params - filter and page */
export function orderQueryString(params: Partial<OrderListParams>): string {
  const search = new URLSearchParams();
  if (params.state) search.set('state', params.state);
  if (params.q) search.set('q', params.q);
  if (params.flagged) search.set('flagged', 'true');
  if (params.page) search.set('page', String(params.page));
  if (params.pageSize) search.set('pageSize', String(params.pageSize));
  return search.size ? `?${search}` : '';
}

/** A page of orders. @param params - filter and page */
export function listOrders(params: OrderListParams): Promise<OrderListResponse> {
  return api(`/orders${orderQueryString(params)}`, { schema: OrderListResponseSchema });
}

/** One order with its history. @param id - the order id */
export function getOrder(id: string): Promise<OrderDetail> {
  return api(`/orders/${encodeURIComponent(id)}`, { schema: OrderDetailSchema });
}

/** Moves an order along. @param id - the order @param body - the new state and tracking link */
export function moveOrder(id: string, body: OrderTransitionRequest): Promise<unknown> {
  return api(`/orders/${encodeURIComponent(id)}/transition`, { method: 'POST', body });
}

/** Cancels an unpaid order or refunds a paid one. @param id - the order @param body - the reason */
export function cancelOrder(id: string, body: OrderCancelRequest): Promise<unknown> {
  return api(`/orders/${encodeURIComponent(id)}/cancel`, { method: 'POST', body });
}

/**
 * Accepts a flagged payment after checking it with the payment service: the order becomes paid.
 * @param id - the order
 * @param body - what was checked
 */
export function clearOrderFlag(id: string, body: OrderClearFlagRequest): Promise<unknown> {
  return api(`/orders/${encodeURIComponent(id)}/clear-flag`, { method: 'POST', body });
}
