/** `/api/families`: variant families, their computation, review workflow, photos, diff and audit log. */
import { Router, type RequestHandler } from 'express';
import multer from 'multer';
import { z } from 'zod';
import {
  FamilyCreateSchema,
  FamilyUpdateSchema,
  type FamilyAction,
  type FamilyUpdate,
} from '../../shared/schemas/familySpec';
import { VariantListQuerySchema, type VariantListQuery } from '../../shared/schemas/variant';
import {
  ReturnDecisionSchema,
  ReviewDecisionSchema,
  RevisionDiffQuerySchema,
  type ReturnDecision,
  type ReviewDecision,
} from '../../shared/schemas/review';
import { AcknowledgementsCreateSchema, type AcknowledgementsCreate } from '../../shared/schemas/gate';
import { PHOTO_MAX_BYTES } from '../../shared/schemas/photo';
import { FamilyListQuerySchema, type FamilyListQuery } from '../../shared/schemas/family';
import { FAMILY_TRANSITIONS } from '../../shared/families/familyWorkflow';
import type { AppContext } from '../context';
import { requireRole, signedInPerson } from '../auth/requireRole';
import { HttpError, fieldProblem } from '../http/HttpError';
import { parsedBody, parsedParams, parsedQuery, validate } from '../http/validate';
import { familyJobs } from '../jobs/FamilyJobRunner';
import { acknowledgeWarnings, createFamily, updateFamily } from '../services/families/familyCommands';
import { cancelCompute, startCompute } from '../services/families/familyCompute';
import {
  currentRevisionId,
  diffRevisions,
  familyAudit,
  getFamily,
  listFamilies,
  listVariants,
} from '../services/families/familyQueries';
import { transitionFamily } from '../services/families/familyTransitions';
import { linkBase } from '../mail/linkBase';
import { addPhoto } from '../services/photoService';

/** Route parameter `:id`. */
const IdParamsSchema = z.object({ id: z.string().min(1).max(64) });

/** Who reads families: designers build them, catalogue managers review them. */
const READERS = ['designer', 'catalogue_manager'] as const;

/** Multipart upload of one photo, kept in memory (at most PHOTO_MAX_BYTES) and checked by content afterwards. */
const photoUpload: RequestHandler = (req, res, next) => {
  multer({ storage: multer.memoryStorage(), limits: { fileSize: PHOTO_MAX_BYTES, files: 1, fields: 4 } }).single(
    'photo',
  )(req, res, (err: unknown) => {
    if (!err) return next();
    if (err instanceof multer.MulterError) {
      if (err.code === 'LIMIT_FILE_SIZE') {
        return next(
          new HttpError(
            413,
            'payload_too_large',
            `The photo is larger than ${PHOTO_MAX_BYTES / 1024 / 1024} MB: choose a smaller one.`,
          ),
        );
      }
      return next(
        fieldProblem(err.field ?? 'photo', `The upload was refused (${err.message.toLowerCase()}): attach one photo.`),
      );
    }
    next(err);
  });
};

/**
 * Builds the families router (mounted at `/api/families`).
 * @param ctx - the application context
 */
export function familiesRouter(ctx: AppContext): Router {
  const router = Router();
  const readers = requireRole(...READERS);
  const designers = requireRole('designer');
  const managers = requireRole('catalogue_manager');
  const idParams = validate({ params: IdParamsSchema });
  const idOf = (res: Parameters<RequestHandler>[1]): string => parsedParams<{ id: string }>(res).id;

  router.get('/', readers, validate({ query: FamilyListQuerySchema }), async (_req, res) => {
    res.json({ families: await listFamilies(ctx, parsedQuery<FamilyListQuery>(res)) });
  });

  router.post('/', designers, validate({ body: FamilyCreateSchema }), async (_req, res) => {
    const family = await createFamily(ctx, signedInPerson(res), parsedBody(res));
    res.status(201).json({ family });
  });

  router.get('/:id', readers, idParams, async (_req, res) => {
    res.json({ family: await getFamily(ctx, idOf(res), signedInPerson(res)) });
  });

  router.patch('/:id', designers, validate({ params: IdParamsSchema, body: FamilyUpdateSchema }), async (_req, res) => {
    const family = await updateFamily(ctx, signedInPerson(res), idOf(res), parsedBody<FamilyUpdate>(res));
    res.json({ family });
  });

  router.post('/:id/compute', designers, idParams, async (_req, res) => {
    res.status(202).json(await startCompute(ctx, signedInPerson(res), idOf(res)));
  });

  router.post('/:id/cancel', designers, idParams, async (_req, res) => {
    res.json(await cancelCompute(ctx, signedInPerson(res), idOf(res)));
  });

  router.get('/:id/progress', readers, idParams, async (req, res) => {
    const id = idOf(res);
    const row = { revisionId: await currentRevisionId(ctx, id) };
    const jobs = familyJobs(ctx);
    res.writeHead(200, {
      'Content-Type': 'text/event-stream; charset=utf-8',
      'Cache-Control': 'no-store',
      Connection: 'keep-alive',
      'X-Accel-Buffering': 'no',
    });
    const send = (event: 'progress' | 'done', data: unknown) =>
      res.write(`event: ${event}\ndata: ${JSON.stringify(data)}\n\n`);
    let closed = false;
    // Subscribe before reading the state so no event falls between the two.
    const stop = jobs.subscribe(row.revisionId, (event, done) => {
      if (closed) return;
      send(done ? 'done' : 'progress', event);
      if (done) finish();
    });
    const finish = () => {
      if (closed) return;
      closed = true;
      stop();
      res.end();
    };
    req.on('close', finish);
    await jobs.ready();
    const now = await jobs.progressOf(row.revisionId);
    if (closed) return;
    send('progress', now);
    if (!(await jobs.isActive(row.revisionId))) {
      send('done', now);
      finish();
    }
  });

  router.get(
    '/:id/variants',
    readers,
    validate({ params: IdParamsSchema, query: VariantListQuerySchema }),
    async (_req, res) => {
      res.json(await listVariants(ctx, idOf(res), parsedQuery<VariantListQuery>(res)));
    },
  );

  router.post(
    '/:id/acknowledgements',
    designers,
    validate({ params: IdParamsSchema, body: AcknowledgementsCreateSchema }),
    async (_req, res) => {
      const family = await acknowledgeWarnings(
        ctx,
        signedInPerson(res),
        idOf(res),
        parsedBody<AcknowledgementsCreate>(res),
      );
      res.json({ family });
    },
  );

  const step =
    (action: FamilyAction): RequestHandler =>
    async (req, res) => {
      const body = parsedBody<ReviewDecision & Partial<ReturnDecision>>(res);
      const comment = action === 'return' ? body.comments : body.comment;
      const family = await transitionFamily(ctx, signedInPerson(res), idOf(res), action, {
        ...body,
        comment: comment || undefined,
        linkBase: linkBase(ctx.env, req),
      });
      res.json({ family });
    };
  const bodies: Record<FamilyAction, z.ZodType> = {
    submit: ReviewDecisionSchema,
    approve: ReviewDecisionSchema,
    return: ReturnDecisionSchema,
    publish: ReviewDecisionSchema,
    retire: ReviewDecisionSchema,
  };
  for (const action of Object.keys(FAMILY_TRANSITIONS) as FamilyAction[]) {
    const guard = FAMILY_TRANSITIONS[action].role === 'designer' ? designers : managers;
    router.post(`/:id/${action}`, guard, validate({ params: IdParamsSchema, body: bodies[action] }), step(action));
  }

  router.get(
    '/:id/diff',
    readers,
    validate({ params: IdParamsSchema, query: RevisionDiffQuerySchema }),
    async (_req, res) => {
      const { from, to } = parsedQuery<{ from: number; to: number }>(res);
      res.json(await diffRevisions(ctx, idOf(res), from, to));
    },
  );

  router.get('/:id/audit', readers, idParams, async (_req, res) => {
    res.json(await familyAudit(ctx, idOf(res)));
  });

  router.post('/:id/photos', designers, idParams, photoUpload, async (req, res) => {
    if (!req.file) throw fieldProblem('photo', 'Attach one photo (JPEG, PNG or WebP).');
    const caption = typeof req.body?.caption === 'string' ? req.body.caption.trim().slice(0, 200) : '';
    const photo = await addPhoto(ctx, signedInPerson(res), idOf(res), req.file.buffer, caption);
    res.status(201).json({ photo });
  });

  return router;
}
