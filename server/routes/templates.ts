/** `/api/templates`: the parametric templates, their parameters and live limits, for the editor and other clients. */
import { Router } from 'express';
import { z } from 'zod';
import { requireAuth } from '../auth/requireRole';
import { notFound } from '../http/HttpError';
import { parsedBody, parsedParams, validate } from '../http/validate';
import { describeParameters } from '../../templates/lib/describeParameters';
import { liveLimits } from '../../templates/lib/liveLimits';
import { findTemplate, TEMPLATES } from '../../templates/index';
import { TemplateLimitsRequestSchema, type TemplateLimitsRequest } from '../../shared/schemas/templateLimits';

const TemplateIdParamsSchema = z.object({ id: z.string().min(1) });

/** Builds the templates router (mounted at `/api/templates`); any signed-in person may read it. */
export function templatesRouter(): Router {
  const router = Router();
  router.use(requireAuth);
  router.get('/', (_req, res) => {
    res.json({
      templates: TEMPLATES.map((template) => ({
        id: template.id,
        version: template.version,
        name: template.name,
        summary: template.summary,
        parameters: describeParameters(template),
      })),
    });
  });
  // The range each numeric parameter may take given the others (see templates/lib/liveLimits.ts).
  router.post(
    '/:id/limits',
    validate({ params: TemplateIdParamsSchema, body: TemplateLimitsRequestSchema }),
    (_req, res) => {
      const { id } = parsedParams<{ id: string }>(res);
      const template = findTemplate(id);
      if (!template) throw notFound(`There is no template called "${id}".`);
      const { params } = parsedBody<TemplateLimitsRequest>(res);
      res.json({ limits: liveLimits(template, params) });
    },
  );
  return router;
}
