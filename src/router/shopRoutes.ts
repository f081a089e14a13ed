import type { RouteRecordRaw } from 'vue-router';

/**
 * The public shop's routes: open without signing in, drawn in the shop's own frame, each its own lazy chunk so the
 * first shop page loads only what it shows.
 */
export const shopRoutes: RouteRecordRaw[] = [
  {
    path: '/shop',
    name: 'shop',
    component: () => import('../views/shop/ShopListView.vue'),
    meta: { public: true, shop: true, title: 'Shop' },
  },
  {
    path: '/shop/p/:slug',
    name: 'shop-product',
    component: () => import('../views/shop/ShopProductView.vue'),
    meta: { public: true, shop: true, title: 'Product' },
  },
  {
    path: '/shop/cart',
    name: 'shop-cart',
    component: () => import('../views/shop/ShopCartView.vue'),
    meta: { public: true, shop: true, title: 'Cart' },
  },
  {
    path: '/shop/checkout',
    name: 'shop-checkout',
    component: () => import('../views/shop/ShopCheckoutView.vue'),
    meta: { public: true, shop: true, title: 'Checkout' },
  },
  {
    path: '/shop/orders/:token',
    name: 'shop-order',
    component: () => import('../views/shop/ShopOrderView.vue'),
    meta: { public: true, shop: true, title: 'Your order' },
  },
];
