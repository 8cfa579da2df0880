import type { Router } from 'express';
import type { ServiceContext } from '../../services/context';
import type { AttemptLimitOptions } from '../../middleware/rateLimit';
import { clubsRouter } from './clubs';
import { invitationsRouter } from '../invitations/invitations';

/**
 * Every router that serves club features, with where it is mounted under /api. app.ts mounts
 * exactly this list and the authorization matrix test walks it, so a club route cannot be added
 * without the matrix noticing.
 */
export function clubRouteMounts(
  ctx: ServiceContext,
  options: { rateLimit: AttemptLimitOptions },
): { path: string; router: Router }[] {
  return [
    { path: '/clubs', router: clubsRouter(ctx) },
    { path: '/invitations', router: invitationsRouter(ctx, options) },
  ];
}
