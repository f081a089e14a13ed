/** `/api/templates`: the parametric templates and their parameters, for the design editor and other clients. */
import { Router } from 'express';
import { requireAuth } from '../auth/requireRole';
import { describeParameters } from '../../templates/lib/describeParameters';
import { TEMPLATES } from '../../templates/index';

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
  return router;
}
