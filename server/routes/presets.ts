/** `/api/presets`: a designer's named parameter sets per template (owner-only; others' presets answer 404). */
import { Router } from 'express';
import {
  PresetCreateSchema,
  PresetIdParamsSchema,
  PresetListQuerySchema,
  type PresetCreate,
  type PresetListQuery,
  type PresetUpdate,
  PresetUpdateSchema,
} from '../../shared/schemas/preset';
import type { AppContext } from '../context';
import { requireRole, signedInPerson } from '../auth/requireRole';
import { conflict, notFound } from '../http/HttpError';
import { parsedBody, parsedParams, parsedQuery, validate } from '../http/validate';
import { checkPresetParams } from '../services/presetParams';
import * as store from '../services/presetStore';

function nameTaken(name: string): never {
  throw conflict(
    'preset_name_taken',
    `You already have a preset called "${name}" for this template: choose another name.`,
  );
}

/**
 * Builds the presets router (mounted at `/api/presets`).
 * @param ctx - the application context (database)
 */
export function presetsRouter(ctx: AppContext): Router {
  const router = Router();
  router.use(requireRole('designer'));

  router.get('/', validate({ query: PresetListQuerySchema }), async (_req, res) => {
    const person = signedInPerson(res);
    const { templateId } = parsedQuery<PresetListQuery>(res);
    res.json({ presets: await store.listPresets(ctx.db, person.id, templateId) });
  });

  router.get('/:id', validate({ params: PresetIdParamsSchema }), async (_req, res) => {
    const person = signedInPerson(res);
    const { id } = parsedParams<{ id: string }>(res);
    const preset = await store.findPreset(ctx.db, person.id, id);
    if (!preset) throw notFound('No such preset.');
    res.json(preset);
  });

  router.post('/', validate({ body: PresetCreateSchema }), async (_req, res) => {
    const person = signedInPerson(res);
    const body = parsedBody<PresetCreate>(res);
    const { params, templateVersion } = checkPresetParams(body.templateId, body.params);
    if (await store.presetNameTaken(ctx.db, person.id, body.templateId, body.name)) nameTaken(body.name);
    try {
      const preset = await store.insertPreset(ctx.db, {
        ownerId: person.id,
        templateId: body.templateId,
        templateVersion,
        name: body.name,
        params,
        thumbnail: body.thumbnail ?? null,
      });
      res.status(201).json(preset);
    } catch (err) {
      if (store.isUniqueViolation(err)) nameTaken(body.name);
      throw err;
    }
  });

  router.patch('/:id', validate({ params: PresetIdParamsSchema, body: PresetUpdateSchema }), async (_req, res) => {
    const person = signedInPerson(res);
    const { id } = parsedParams<{ id: string }>(res);
    const body = parsedBody<PresetUpdate>(res);
    const existing = await store.findPreset(ctx.db, person.id, id);
    if (!existing) throw notFound('No such preset.');
    const checked = body.params === undefined ? undefined : checkPresetParams(existing.templateId, body.params);
    if (body.name !== undefined && (await store.presetNameTaken(ctx.db, person.id, existing.templateId, body.name, id)))
      nameTaken(body.name);
    try {
      const preset = await store.updatePreset(ctx.db, person.id, id, {
        name: body.name,
        params: checked?.params,
        templateVersion: checked?.templateVersion,
        thumbnail: body.thumbnail,
      });
      if (!preset) throw notFound('No such preset.');
      res.json(preset);
    } catch (err) {
      if (body.name !== undefined && store.isUniqueViolation(err)) nameTaken(body.name);
      throw err;
    }
  });

  router.delete('/:id', validate({ params: PresetIdParamsSchema }), async (_req, res) => {
    const person = signedInPerson(res);
    const { id } = parsedParams<{ id: string }>(res);
    if (!(await store.deletePreset(ctx.db, person.id, id))) throw notFound('No such preset.');
    res.status(204).end();
  });

  return router;
}
