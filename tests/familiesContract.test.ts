/**
 * The API answers match the shared contract in shared/schemas/family.ts exactly (the screens parse them with these
 * schemas), checked on the seeded demo families.
 */
import { beforeAll, describe, expect, it } from 'vitest';
import type { z } from 'zod';
import { ComputeStatusSchema, VariantListResponseSchema } from '../shared/schemas/variant';
import { AuditListResponseSchema, RevisionDiffSchema } from '../shared/schemas/review';
import { CatalogueResponseSchema } from '../shared/schemas/catalogue';
import { MailMessagesResponseSchema } from '../shared/schemas/mail';
import { FamilyListResponseSchema, FamilyResponseSchema } from '../shared/schemas/family';
import { useTestApp } from './setup/testApp';

const t = useTestApp();
let ids: Record<string, string>;
beforeAll(async () => {
  const list = (await (await t.agent('designer')).get('/api/families')).body.families as Array<{
    id: string;
    code: string;
  }>;
  ids = Object.fromEntries(list.map((f) => [f.code, f.id]));
});

function conforms(schema: z.ZodType, body: unknown): void {
  const result = schema.safeParse(body);
  expect(result.success, result.success ? '' : JSON.stringify(result.error.issues.slice(0, 3))).toBe(true);
}

describe('answers follow the contract', () => {
  it('families, variants, diff, audit', async () => {
    const designer = await t.agent('designer');
    conforms(FamilyListResponseSchema, (await designer.get('/api/families')).body);
    for (const code of ['HGB', 'CAF', 'MGB']) {
      const family = (await designer.get(`/api/families/${ids[code]}`)).body;
      conforms(FamilyResponseSchema, family);
      conforms(
        VariantListResponseSchema,
        (await designer.get(`/api/families/${ids[code]}/variants?pageSize=500`)).body,
      );
      conforms(AuditListResponseSchema, (await designer.get(`/api/families/${ids[code]}/audit`)).body);
      conforms(RevisionDiffSchema, (await designer.get(`/api/families/${ids[code]}/diff?from=1&to=1`)).body);
    }
    const manager = await t.agent('catalogue_manager');
    const review = (await manager.get(`/api/families/${ids.CAF}`)).body.family;
    expect(review.allowedActions).toEqual(['approve', 'return']);
    expect(review.gate.ok).toBe(true);
    const published = (await manager.get(`/api/families/${ids.HGB}`)).body.family;
    expect(published.allowedActions).toEqual(['retire']);
  });

  it('compute status, catalogue and mail', async () => {
    conforms(
      ComputeStatusSchema,
      (await (await t.agent('designer')).post(`/api/families/${ids.HGB}/cancel`).send({})).body,
    );
    conforms(CatalogueResponseSchema, (await (await t.agent('sales')).get('/api/catalogue')).body);
    conforms(MailMessagesResponseSchema, (await (await t.agent('admin')).get('/api/mail/messages')).body);
  });
});
