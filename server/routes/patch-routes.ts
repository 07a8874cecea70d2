import { Router } from 'express';
import { validatePatch } from '../../shared/patch/validate-patch';
import type { AppContext } from '../app-context';
import { requireUser } from '../auth/authenticate';

export function patchRoutes(context: AppContext): Router {
  const router = Router();
  router.use('/patches', requireUser(context));

  /** Checks a patch without saving anything: `{ ok: true }` or `{ ok: false, issues }`, each issue naming its field. */
  router.post('/patches/validate', (request, response) => {
    const result = validatePatch(request.body);
    response.json(result.ok ? { ok: true, issues: [] } : { ok: false, issues: result.issues });
  });

  return router;
}
