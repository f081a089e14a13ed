/**
 * Security headers on every answer (pages, files and API), set with helmet: a Content-Security-Policy the built
 * client works under, no MIME sniffing, no framing, and a strict referrer policy.
 */
import helmet from 'helmet';
import type { RequestHandler } from 'express';

/** Options of {@link securityHeaders}. */
export interface SecurityHeadersOptions {
  /** PUBLIC_ORIGIN: when it is https, insecure sub-requests are upgraded and HSTS is sent. */
  publicOrigin?: string;
  /**
   * Origins a form on our pages may post to besides our own (e.g. a payment page a checkout form is redirected to).
   * Redirects after a fetch and `location` changes are not limited by the policy.
   */
  formActionOrigins?: string[];
}

/**
 * The Content-Security-Policy directives, exported so tests and docs read the same list.
 * - scripts: our own bundle only; `'wasm-unsafe-eval'` lets the geometry worker compile manifold-3d's WebAssembly
 *   (no `'unsafe-eval'`, no inline scripts);
 * - workers: our own module worker (`blob:` for a worker a library builds from a blob);
 * - styles: our own files plus inline styles, which the component library injects at run time and Vue writes as
 *   `style` attributes;
 * - images: our own, `data:` and `blob:` (three.js textures, previews of files chosen for upload);
 * - fonts: our own bundled files and `data:`;
 * - connections: our own API only; no plugins, no `<base>` changes, and no page may frame ours.
 * @param options - see {@link SecurityHeadersOptions}
 */
export function contentSecurityPolicyDirectives(options: SecurityHeadersOptions = {}): Record<string, string[]> {
  const directives: Record<string, string[]> = {
    'default-src': ["'self'"],
    'script-src': ["'self'", "'wasm-unsafe-eval'"],
    'script-src-attr': ["'none'"],
    'worker-src': ["'self'", 'blob:'],
    'style-src': ["'self'", "'unsafe-inline'"],
    'img-src': ["'self'", 'data:', 'blob:'],
    'font-src': ["'self'", 'data:'],
    'connect-src': ["'self'"],
    'object-src': ["'none'"],
    'base-uri': ["'self'"],
    'form-action': ["'self'", ...(options.formActionOrigins ?? [])],
    'frame-ancestors': ["'none'"],
  };
  if (options.publicOrigin?.startsWith('https:')) directives['upgrade-insecure-requests'] = [];
  return directives;
}

/**
 * The helmet middleware with our policy. Cross-origin isolation headers stay off (the client needs none of them and
 * they would block a payment page opened from ours); HSTS only when the public origin is https.
 * @param options - see {@link SecurityHeadersOptions}
 */
export function securityHeaders(options: SecurityHeadersOptions = {}): RequestHandler {
  const https = options.publicOrigin?.startsWith('https:') ?? false;
  return helmet({
    contentSecurityPolicy: { useDefaults: false, directives: contentSecurityPolicyDirectives(options) },
    crossOriginEmbedderPolicy: false,
    crossOriginOpenerPolicy: false,
    crossOriginResourcePolicy: { policy: 'same-origin' },
    referrerPolicy: { policy: 'strict-origin-when-cross-origin' },
    strictTransportSecurity: https ? { maxAge: 15_552_000, includeSubDomains: false } : false,
    xFrameOptions: { action: 'deny' },
    xContentTypeOptions: true,
  });
}
