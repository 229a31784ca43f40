import { Router } from 'express';
import type { AppDeps } from '../../deps';

/** Routes of this resource (being built). */
export function panelsRouter(_deps: AppDeps): Router {
  const router = Router();
  return router;
}
