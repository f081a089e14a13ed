/**
 * The migration to quote lines: a quote saved before lines existed (one SKU and quantity on the quote itself)
 * becomes a quote with one line carrying its figures, a validity date 30 days after it was made, no tax or shipping,
 * and its total unchanged. The migrations before it are applied to a new database, an old quote is written, then
 * the rest are applied.
 */
import { cpSync, mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { PGlite } from '@electric-sql/pglite';
import { drizzle } from 'drizzle-orm/pglite';
import { migrate } from 'drizzle-orm/pglite/migrator';
import { afterAll, describe, expect, it } from 'vitest';
import { MIGRATIONS_DIR } from '../server/db/client';

const dirs: string[] = [];
afterAll(() => dirs.forEach((dir) => rmSync(dir, { recursive: true, force: true })));

/** A copy of drizzle/ whose journal stops before the quote-lines migration. */
function migrationsBeforeQuoteLines(): string {
  const dir = mkdtempSync(join(tmpdir(), 'quote-migration-'));
  dirs.push(dir);
  cpSync(MIGRATIONS_DIR, dir, { recursive: true });
  const journalPath = join(dir, 'meta', '_journal.json');
  const journal = JSON.parse(readFileSync(journalPath, 'utf8')) as { entries: Array<{ tag: string }> };
  const cut = journal.entries.findIndex((entry) => entry.tag.endsWith('_quote_lines'));
  expect(cut).toBeGreaterThan(0);
  journal.entries = journal.entries.slice(0, cut);
  writeFileSync(journalPath, JSON.stringify(journal));
  return dir;
}

describe('quote lines migration', { timeout: 180_000 }, () => {
  it('turns each existing quote into one line', async () => {
    const client = new PGlite();
    const db = drizzle(client);
    try {
      await migrate(db, { migrationsFolder: migrationsBeforeQuoteLines() });
      await client.exec(`
        insert into studios (id, name) values ('s1', 'Fernhollow');
        insert into people (id, email, name, password_hash, roles, studio_id)
          values ('p1', 'ada@example.test', 'Ada', 'x', array['sales'], 's1');
        insert into quotes (id, sku, product_name, family_name, customer_name, quantity, delivery_date, currency,
          unit_cost_cents, list_price_cents, discount_pct, unit_price_cents, total_price_cents, margin_pct, farm,
          breaks, earliest_delivery_date, feasible, created_by_id, created_at)
        values ('q1', 'FH-GB-32', 'Gable box, 32 mm', 'Gable box', 'Wren & Co', 120, '2027-06-30', 'EUR', 1900, 4500,
          10, 4050, 486000, 53.08, '{"printers":4,"hoursPerDay":20,"copiesPerPlate":2,"failureRatePct":5,
          "plateChangeMin":10,"handlingDays":2,"printTimeMin":300,"plates":64,"platesPerPrinter":16,
          "plateTimeMin":610,"expectedGoodUnits":121.6,"printDays":8.13,"leadTimeDays":11}',
          '[{"minQuantity":100,"discountPct":10,"unitPriceCents":4050}]', '2027-03-12', true, 'p1',
          '2027-03-01T10:00:00Z');
      `);
      await migrate(db, { migrationsFolder: MIGRATIONS_DIR });

      const quote = (
        await client.query<Record<string, unknown>>(
          `select status, valid_until::text as valid_until, terms, tax_rate_pct, shipping_cents, subtotal_cents,
             tax_cents, total_price_cents, cost_cents, margin_pct from quotes where id = 'q1'`,
        )
      ).rows[0];
      // 120 × 40.50 = 4,860.00 goods; cost 120 × 19.00 = 2,280.00; valid 30 days from 1 March = 31 March.
      expect(quote).toEqual({
        status: 'draft',
        valid_until: '2027-03-31',
        terms: '',
        tax_rate_pct: 0,
        shipping_cents: 0,
        subtotal_cents: 486_000,
        tax_cents: 0,
        total_price_cents: 486_000,
        cost_cents: 228_000,
        margin_pct: 53.08,
      });
      const lines = (await client.query<Record<string, unknown>>(`select * from quote_lines where quote_id = 'q1'`))
        .rows;
      expect(lines).toHaveLength(1);
      expect(lines[0]).toMatchObject({
        position: 0,
        sku: 'FH-GB-32',
        product_name: 'Gable box, 32 mm',
        quantity: 120,
        unit_cost_cents: 1900,
        list_price_cents: 4500,
        discount_pct: 10,
        break_price_cents: 4050,
        unit_price_cents: 4050,
        price_set_by_hand: false,
        line_total_cents: 486_000,
      });
      expect((lines[0].farm as { plates: number }).plates).toBe(64);
    } finally {
      await client.close();
    }
  });
});
