/** Demo studio and people (an invented scenario, local demo only; all share the password below). */
import { eq } from 'drizzle-orm';
import type { Role } from '../../shared/schemas/auth';
import { hashPassword } from '../auth/password';
import type { Db } from './client';
import { people, studios } from './schema';
import { registerSeedStep } from './seedRegistry';

/** The demo studio's name. */
export const DEMO_STUDIO_NAME = 'Fernhollow Studio';

/** Password of every demo person (README, local demo only). */
export const DEMO_PASSWORD = 'fernhollow-demo';

/** One demo person per role. */
export const DEMO_PEOPLE: ReadonlyArray<{ email: string; name: string; roles: Role[] }> = [
  { email: 'maren@fernhollow.test', name: 'Maren Hale', roles: ['designer'] },
  { email: 'tobias@fernhollow.test', name: 'Tobias Reyne', roles: ['catalogue_manager'] },
  { email: 'ada@fernhollow.test', name: 'Ada Quill', roles: ['sales'] },
  { email: 'ines@fernhollow.test', name: 'Ines Marlow', roles: ['operations'] },
  { email: 'joss@fernhollow.test', name: 'Joss Whitby', roles: ['admin'] },
];

/**
 * The id of the seeded demo person holding `role` (for later seed steps that create their designs).
 * @param db - database
 * @param role - one of the four roles
 */
export async function demoPersonId(db: Db, role: Role): Promise<string> {
  const demo = DEMO_PEOPLE.find((person) => person.roles.includes(role));
  if (!demo) throw new Error(`No demo person holds ${role}`);
  const [row] = await db.select({ id: people.id }).from(people).where(eq(people.email, demo.email));
  if (!row) throw new Error(`Demo person ${demo.email} is not seeded yet`);
  return row.id;
}

registerSeedStep({
  name: 'demo-studio-and-people',
  demo: true,
  async run({ db, log }) {
    const [studio] = await db.insert(studios).values({ name: DEMO_STUDIO_NAME }).returning({ id: studios.id });
    const passwordHash = await hashPassword(DEMO_PASSWORD);
    await db.insert(people).values(DEMO_PEOPLE.map((person) => ({ ...person, passwordHash, studioId: studio.id })));
    log(`  demo: ${DEMO_STUDIO_NAME} with ${DEMO_PEOPLE.length} people (password ${DEMO_PASSWORD})`);
  },
});
