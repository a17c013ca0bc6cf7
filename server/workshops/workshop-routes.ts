import { Router } from 'express';
import {
  invitationRequestSchema,
  memberRoleRequestSchema,
  workshopRequestSchema,
} from '../../shared/account-schemas.js';
import { signedIn } from '../auth/session-middleware.js';
import type { ServerContext } from '../context.js';
import { pathId } from '../core/path-ids.js';
import { validate } from '../core/validate.js';
import {
  acceptInvitation,
  invite,
  openInvitations,
  previewInvitation,
  revokeInvitation,
} from './invitation-service.js';
import {
  changeRole,
  createWorkshop,
  membersOf,
  removeMember,
  renameWorkshop,
  workshopsOf,
} from './workshop-service.js';

const id = pathId;

export function workshopRoutes(ctx: ServerContext): Router {
  const router = Router();

  router.get('/workshops', async (_req, res) => {
    res.json(await workshopsOf(ctx.db, signedIn(res).user.id));
  });

  router.post('/workshops', async (req, res) => {
    const { user } = signedIn(res);
    res.status(201).json(await createWorkshop(ctx.db, user.id, validate(workshopRequestSchema, req.body).name));
  });

  router.patch('/workshops/:workshopId', async (req, res) => {
    const { user } = signedIn(res);
    const { name } = validate(workshopRequestSchema, req.body);
    res.json(await renameWorkshop(ctx, user.id, id(req.params['workshopId']), name));
  });

  router.get('/workshops/:workshopId/members', async (req, res) => {
    res.json(await membersOf(ctx, signedIn(res).user.id, id(req.params['workshopId'])));
  });

  router.patch('/workshops/:workshopId/members/:userId', async (req, res) => {
    const { user } = signedIn(res);
    const { role } = validate(memberRoleRequestSchema, req.body);
    res.json(await changeRole(ctx, user.id, id(req.params['workshopId']), id(req.params['userId']), role));
  });

  router.delete('/workshops/:workshopId/members/:userId', async (req, res) => {
    const { user } = signedIn(res);
    await removeMember(ctx, user.id, id(req.params['workshopId']), id(req.params['userId']));
    res.status(204).end();
  });

  router.get('/workshops/:workshopId/invitations', async (req, res) => {
    res.json(await openInvitations(ctx, signedIn(res).user.id, id(req.params['workshopId'])));
  });

  router.post('/workshops/:workshopId/invitations', async (req, res) => {
    const { user } = signedIn(res);
    const { email, role } = validate(invitationRequestSchema, req.body);
    res.status(201).json(await invite(ctx, user, id(req.params['workshopId']), email, role));
  });

  router.delete('/workshops/:workshopId/invitations/:invitationId', async (req, res) => {
    const { user } = signedIn(res);
    await revokeInvitation(ctx, user.id, id(req.params['workshopId']), id(req.params['invitationId']));
    res.status(204).end();
  });

  router.get('/invitations/:token', async (req, res) => {
    res.set('Cache-Control', 'no-store').json(await previewInvitation(ctx, req.params['token'] ?? ''));
  });

  router.post('/invitations/:token/accept', async (req, res) => {
    const { user } = signedIn(res);
    res.json(await acceptInvitation(ctx, user, req.params['token'] ?? ''));
  });

  return router;
}
