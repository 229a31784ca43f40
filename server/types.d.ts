import type { AppAbility } from '@domain/abilities';
import type { Tenant as TenantModel } from './models/Tenant';
import type { User as UserModel } from './models/User';
import type { Ctx } from './context';

declare global {
  namespace Express {
    // passport's req.user is our User model, with its tenant loaded
    interface User extends UserModel {}
    interface Request {
      /** set first thing by the request log (server/middlewares/request-log.ts) */
      requestId: string;
      ability: AppAbility;
      ctx: Ctx;
      input: { body: unknown; query: unknown; params: unknown };
      firm?: TenantModel | null;
    }
  }
}

declare module 'express-session' {
  interface SessionData {
    csrfIssuedAt?: number;
    passport?: { user?: string };
  }
}

export {};
