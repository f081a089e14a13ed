/** Computing a family's variants in the background: start and cancel. */
import type { Person } from '../../../shared/schemas/auth';
import type { ComputeStatus } from '../../../shared/schemas/variant';
import { familyJobs } from '../../jobs/FamilyJobRunner';
import { recordAudit } from '../audit';
import { toComputeStatus } from '../familyView';
import { familySubject, invalidState, loadFamily, type FamilyContext } from './loadFamily';

/**
 * Starts computing the current revision in the background (a draft only).
 * @param ctx - app context
 * @param person - the designer
 * @param id - family id
 */
export async function startCompute(ctx: FamilyContext, person: Person, id: string): Promise<ComputeStatus> {
  const { current } = await loadFamily(ctx.db, id);
  if (current.state !== 'draft') {
    throw invalidState(`cannot compute a family that is ${current.state.replace('_', ' ')}; only a draft is computed`);
  }
  await familyJobs(ctx).enqueue(current.id);
  await recordAudit(ctx.db, {
    actorId: person.id,
    action: 'family.compute_started',
    subject: familySubject(id),
    details: { revision: current.number },
  });
  const { current: queued } = await loadFamily(ctx.db, id);
  return toComputeStatus(queued);
}

/**
 * Cancels the computation of the current revision (nothing happens when none runs).
 * @param ctx - app context
 * @param person - the designer
 * @param id - family id
 */
export async function cancelCompute(ctx: FamilyContext, person: Person, id: string): Promise<ComputeStatus> {
  const { current } = await loadFamily(ctx.db, id);
  if (await familyJobs(ctx).cancel(current.id)) {
    await recordAudit(ctx.db, {
      actorId: person.id,
      action: 'family.compute_cancelled',
      subject: familySubject(id),
      details: { revision: current.number },
    });
  }
  const { current: after } = await loadFamily(ctx.db, id);
  return toComputeStatus(after);
}
