import { Router } from 'express';
import {
  pushSubscriptionSchema,
  pushUnsubscribeSchema,
  reminderPreferencesSchema,
} from '../../shared/reminder-preferences.js';
import { signedIn } from '../auth/session-middleware.js';
import type { ServerContext } from '../context.js';
import { validate } from '../core/validate.js';
import { devicesOf, preferencesOf, savePreferences, subscribe, unsubscribe } from './reminder-settings.js';
import { vapidKeys } from './vapid-keys.js';

export function reminderRoutes(ctx: ServerContext): Router {
  const router = Router();

  router.get('/reminders/push-key', async (_req, res) => {
    res.json({ publicKey: (await vapidKeys(ctx.db)).publicKey });
  });

  router.get('/account/reminders', async (_req, res) => {
    const userId = signedIn(res).user.id;
    res
      .set('Cache-Control', 'no-store')
      .json({ ...(await preferencesOf(ctx, userId)), devices: await devicesOf(ctx, userId) });
  });

  router.put('/account/reminders', async (req, res) => {
    res.json(
      (await savePreferences(ctx, signedIn(res).user.id, validate(reminderPreferencesSchema, req.body))).preferences,
    );
  });

  router.post('/account/push-subscriptions', async (req, res) => {
    await subscribe(ctx, signedIn(res).user.id, validate(pushSubscriptionSchema, req.body));
    res.status(204).end();
  });

  router.delete('/account/push-subscriptions', async (req, res) => {
    await unsubscribe(ctx, signedIn(res).user.id, validate(pushUnsubscribeSchema, req.body).endpoint);
    res.status(204).end();
  });

  return router;
}
