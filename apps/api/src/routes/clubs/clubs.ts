import { Router, type Request } from 'express';
import { validate } from '../../middleware/validate';
import { currentUser, requireUser } from '../../middleware/session';
import type { ServiceContext } from '../../services/context';
import * as clubs from '../../services/clubs';
import * as clubBank from '../../services/clubBank';
import {
  ClubActivityQuerySchema,
  ClubListingCreateSchema,
  ClubListingParamsSchema,
  StrainRequestCreateSchema,
  StrainRequestParamsSchema,
  StrainRequestReceiveSchema,
  StrainRequestRespondSchema,
  ClubCreateSchema,
  ClubInvitationCreateSchema,
  ClubInvitationParamsSchema,
  ClubMemberParamsSchema,
  ClubMemberUpdateSchema,
  ClubParamsSchema,
  ClubUpdateSchema,
  ClubStockCreateSchema,
  ClubStockParamsSchema,
  ClubStockUpdateSchema,
  ClubStockWithdrawSchema,
} from './schema';

type Params = {
  clubId: string;
  userId: string;
  invitationId: string;
  listingId: string;
  requestId: string;
  cultureId: string;
};
const p = (req: Request) => req.params as unknown as Params;
const actor = (req: Request) => currentUser(req);

/** Clubs, members and invitations. Routes parse; services/clubs.ts authorizes (via clubAccess). */
export function clubsRouter(ctx: ServiceContext) {
  const router = Router();
  router.use(requireUser);

  router.get('/', async (req, res) => {
    res.json({ clubs: await clubs.listMyClubs(ctx, actor(req)) });
  });

  router.post('/', validate({ body: ClubCreateSchema }), async (req, res) => {
    res.status(201).json({ club: await clubs.createClub(ctx, actor(req), req.body) });
  });

  router.get('/:clubId', validate({ params: ClubParamsSchema }), async (req, res) => {
    res.json({ club: await clubs.getClub(ctx, actor(req), p(req).clubId) });
  });

  router.patch('/:clubId', validate({ params: ClubParamsSchema, body: ClubUpdateSchema }), async (req, res) => {
    res.json({ club: await clubs.updateClub(ctx, actor(req), p(req).clubId, req.body) });
  });

  router.delete('/:clubId', validate({ params: ClubParamsSchema }), async (req, res) => {
    await clubs.deleteClub(ctx, actor(req), p(req).clubId);
    res.status(204).end();
  });

  router.post('/:clubId/leave', validate({ params: ClubParamsSchema }), async (req, res) => {
    await clubs.leaveClub(ctx, actor(req), p(req).clubId);
    res.status(204).end();
  });

  router.get('/:clubId/members', validate({ params: ClubParamsSchema }), async (req, res) => {
    res.json({ members: await clubs.listClubMembers(ctx, actor(req), p(req).clubId) });
  });

  router.patch(
    '/:clubId/members/:userId',
    validate({ params: ClubMemberParamsSchema, body: ClubMemberUpdateSchema }),
    async (req, res) => {
      const { clubId, userId } = p(req);
      res.json({ member: await clubs.changeMemberRole(ctx, actor(req), clubId, userId, req.body) });
    },
  );

  router.delete('/:clubId/members/:userId', validate({ params: ClubMemberParamsSchema }), async (req, res) => {
    const { clubId, userId } = p(req);
    const me = actor(req);
    if (userId === me.id) await clubs.leaveClub(ctx, me, clubId);
    else await clubs.removeMember(ctx, me, clubId, userId);
    res.status(204).end();
  });

  router.get('/:clubId/invitations', validate({ params: ClubParamsSchema }), async (req, res) => {
    res.json({ invitations: await clubs.listClubInvitations(ctx, actor(req), p(req).clubId) });
  });

  router.post(
    '/:clubId/invitations',
    validate({ params: ClubParamsSchema, body: ClubInvitationCreateSchema }),
    async (req, res) => {
      res.status(201).json({ invitation: await clubs.createInvitation(ctx, actor(req), p(req).clubId, req.body) });
    },
  );

  router.delete(
    '/:clubId/invitations/:invitationId',
    validate({ params: ClubInvitationParamsSchema }),
    async (req, res) => {
      const { clubId, invitationId } = p(req);
      res.json({ invitation: await clubs.revokeClubInvitation(ctx, actor(req), clubId, invitationId) });
    },
  );

  /* The bank, requests and handoffs */

  router.get('/:clubId/bank', validate({ params: ClubParamsSchema }), async (req, res) => {
    res.json({ listings: await clubBank.listBank(ctx, actor(req), p(req).clubId) });
  });

  router.post(
    '/:clubId/bank',
    validate({ params: ClubParamsSchema, body: ClubListingCreateSchema }),
    async (req, res) => {
      const listing = await clubBank.listCulture(ctx, actor(req), p(req).clubId, req.body);
      res.status(201).json({ listing: { id: listing.id, cultureId: listing.cultureId } });
    },
  );

  router.delete('/:clubId/bank/:listingId', validate({ params: ClubListingParamsSchema }), async (req, res) => {
    await clubBank.withdrawListing(ctx, actor(req), p(req).clubId, p(req).listingId);
    res.status(204).end();
  });

  router.get('/:clubId/requests', validate({ params: ClubParamsSchema }), async (req, res) => {
    res.json({ requests: await clubBank.listRequests(ctx, actor(req), p(req).clubId) });
  });

  router.post(
    '/:clubId/requests',
    validate({ params: ClubParamsSchema, body: StrainRequestCreateSchema }),
    async (req, res) => {
      const row = await clubBank.createRequest(ctx, actor(req), p(req).clubId, req.body);
      res.status(201).json({ request: { id: row.id, status: row.status } });
    },
  );

  router.post(
    '/:clubId/requests/:requestId/respond',
    validate({ params: StrainRequestParamsSchema, body: StrainRequestRespondSchema }),
    async (req, res) => {
      const { clubId, requestId } = p(req);
      res.json({ request: await clubBank.respondToRequest(ctx, actor(req), clubId, requestId, req.body) });
    },
  );

  router.post(
    '/:clubId/requests/:requestId/cancel',
    validate({ params: StrainRequestParamsSchema }),
    async (req, res) => {
      const { clubId, requestId } = p(req);
      res.json({ request: await clubBank.cancelRequest(ctx, actor(req), clubId, requestId) });
    },
  );

  router.post(
    '/:clubId/requests/:requestId/receive',
    validate({ params: StrainRequestParamsSchema, body: StrainRequestReceiveSchema }),
    async (req, res) => {
      const { clubId, requestId } = p(req);
      res.status(201).json(await clubBank.receiveHandoff(ctx, actor(req), clubId, requestId, req.body));
    },
  );

  router.get(
    '/:clubId/activity',
    validate({ params: ClubParamsSchema, query: ClubActivityQuerySchema }),
    async (req, res) => {
      const query = req.query as unknown as { before?: string; limit: number };
      res.json(await clubBank.listActivity(ctx, actor(req), p(req).clubId, query));
    },
  );

  /* Club-owned stock */

  router.get('/:clubId/stock', validate({ params: ClubParamsSchema }), async (req, res) => {
    res.json({ stock: await clubBank.listStock(ctx, actor(req), p(req).clubId) });
  });

  router.post(
    '/:clubId/stock',
    validate({ params: ClubParamsSchema, body: ClubStockCreateSchema }),
    async (req, res) => {
      res.status(201).json({ stock: await clubBank.addStock(ctx, actor(req), p(req).clubId, req.body) });
    },
  );

  router.patch(
    '/:clubId/stock/:cultureId',
    validate({ params: ClubStockParamsSchema, body: ClubStockUpdateSchema }),
    async (req, res) => {
      const { clubId, cultureId } = p(req);
      res.json({ stock: await clubBank.updateStock(ctx, actor(req), clubId, cultureId, req.body) });
    },
  );

  router.post(
    '/:clubId/stock/:cultureId/withdraw',
    validate({ params: ClubStockParamsSchema, body: ClubStockWithdrawSchema }),
    async (req, res) => {
      const { clubId, cultureId } = p(req);
      res.status(201).json(await clubBank.withdrawStock(ctx, actor(req), clubId, cultureId, req.body));
    },
  );

  return router;
}
