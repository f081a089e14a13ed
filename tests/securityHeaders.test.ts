/**
 * Security headers: every answer (page, asset, API, error) carries a Content-Security-Policy, nosniff, a framing
 * ban and a referrer policy; answers carrying a session or personal data are `Cache-Control: no-store`.
 * The browser side (the built client working under the policy, no console CSP errors) is checked in
 * tests/e2e/designer.e2e.test.ts.
 */
import { mkdir, mkdtemp, rm, writeFile } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import supertest from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createApp } from '../server/app';
import { DEMO_PASSWORD, DEMO_PEOPLE } from '../server/db/seedDemo';
import { makeTestApp, useTestApp, TEST_ORIGIN } from './setup/testApp';

const t = useTestApp();
let clientDir: string;
beforeAll(async () => {
  clientDir = await mkdtemp(join(tmpdir(), 'nestwright-csp-'));
  await mkdir(join(clientDir, 'assets'));
  await writeFile(join(clientDir, 'index.html'), '<!doctype html><title>Nestwright</title>');
  await writeFile(join(clientDir, 'assets', 'main-abc123.js'), 'console.log(1)');
});
afterAll(async () => {
  await rm(clientDir, { recursive: true, force: true });
});

/** The CSP header parsed into directive → sources. */
function parseCsp(header: string | undefined): Map<string, string[]> {
  const map = new Map<string, string[]>();
  for (const part of (header ?? '').split(';')) {
    const [name, ...sources] = part.trim().split(/\s+/);
    if (name) map.set(name, sources);
  }
  return map;
}

describe('security headers', () => {
  it('are on pages, hashed assets, API answers and errors', async () => {
    const app = createApp(t.ctx, { clientDir });
    for (const path of ['/', '/designs/42', '/assets/main-abc123.js', '/api/health', '/api/nothing-here']) {
      const res = await supertest(app).get(path);
      // source: Content Security Policy Level 3, W3C, 2024 (frame-ancestors, script-src, worker-src)
      const csp = parseCsp(res.headers['content-security-policy']);
      expect(csp.get('default-src'), path).toEqual(["'self'"]);
      expect(csp.get('frame-ancestors'), path).toEqual(["'none'"]);
      expect(csp.get('object-src'), path).toEqual(["'none'"]);
      // WebAssembly compiles under 'wasm-unsafe-eval'; general eval and inline scripts stay forbidden.
      expect(csp.get('script-src'), path).toContain("'wasm-unsafe-eval'");
      expect(csp.get('script-src'), path).not.toContain("'unsafe-eval'");
      expect(csp.get('script-src'), path).not.toContain("'unsafe-inline'");
      expect(csp.get('worker-src'), path).toContain("'self'");
      expect(csp.get('img-src'), path).toEqual(expect.arrayContaining(["'self'", 'data:', 'blob:']));
      expect(csp.get('font-src'), path).toContain("'self'");
      // source: Fetch Standard, WHATWG, 2024 (X-Content-Type-Options: nosniff)
      expect(res.headers['x-content-type-options'], path).toBe('nosniff');
      expect(res.headers['x-frame-options'], path).toBe('DENY');
      // source: Referrer Policy, W3C Candidate Recommendation, 2017
      expect(res.headers['referrer-policy'], path).toBe('strict-origin-when-cross-origin');
      expect(res.headers['x-powered-by'], path).toBeUndefined();
    }
  });

  it('do not upgrade requests on a plain-http origin, and do on https', async () => {
    const plain = await supertest(t.app).get('/api/health');
    expect(parseCsp(plain.headers['content-security-policy']).has('upgrade-insecure-requests')).toBe(false);
    expect(plain.headers['strict-transport-security']).toBeUndefined();
    const secure = await makeTestApp({ PUBLIC_ORIGIN: 'https://nest.example.test' });
    try {
      const res = await supertest(secure.app).get('/api/health');
      expect(parseCsp(res.headers['content-security-policy']).has('upgrade-insecure-requests')).toBe(true);
      expect(res.headers['strict-transport-security']).toMatch(/max-age=\d+/);
    } finally {
      await secure.close();
    }
  });

  it('mark the sign-in answer, the session and personal data no-store', async () => {
    // source: RFC 9111 HTTP Caching, IETF, 2022 (no-store)
    const person = DEMO_PEOPLE.find((p) => p.roles.includes('admin'))!;
    const agent = supertest.agent(t.app).set('Origin', TEST_ORIGIN);
    const signIn = await agent.post('/api/auth/sign-in').send({ email: person.email, password: DEMO_PASSWORD });
    expect(signIn.status).toBe(200);
    expect(signIn.headers['set-cookie']).toBeDefined();
    expect(signIn.headers['cache-control']).toBe('no-store');
    for (const path of ['/api/auth/me', '/api/people']) {
      const res = await agent.get(path);
      expect(res.status, path).toBe(200);
      expect(res.headers['cache-control'], path).toBe('no-store');
    }
  });
});
