/** The reminder routes as the API description lists them; see openapi-document.ts for the rest. */
import type * as z from 'zod';
import {
  pushSubscriptionSchema,
  pushUnsubscribeSchema,
  reminderPreferencesSchema,
} from '../../shared/reminder-preferences.js';
import type { ApiRoute } from './openapi-document.js';

export const REMINDER_BODY_NAMES = new Map<z.ZodType, string>([
  [reminderPreferencesSchema, 'ReminderPreferences'],
  [pushSubscriptionSchema, 'PushSubscription'],
  [pushUnsubscribeSchema, 'PushUnsubscribe'],
]);

export const REMINDER_ROUTES: readonly ApiRoute[] = [
  {
    method: 'get',
    path: '/api/reminders/push-key',
    tag: 'Reminders',
    summary: "The server's public VAPID key, to subscribe a browser to pushes",
    access: 'anyone',
    success: {
      status: 200,
      description: '`{ publicKey }`, base64url: the applicationServerKey for PushManager.subscribe().',
    },
  },
  {
    method: 'get',
    path: '/api/account/reminders',
    tag: 'Reminders',
    summary: 'Your reminder choices and the devices that take your pushes',
    access: 'signed-in',
    success: {
      status: 200,
      description:
        '`{ preferences, saved, devices }`: which reminders, by which channels, quiet hours and time zone (the defaults, with `saved: false`, until the member chooses), and each subscribed device by name.',
    },
  },
  {
    method: 'put',
    path: '/api/account/reminders',
    tag: 'Reminders',
    summary: 'Choose your reminders',
    access: 'signed-in',
    body: reminderPreferencesSchema,
    success: { status: 200, description: 'The choices as saved.' },
  },
  {
    method: 'post',
    path: '/api/account/push-subscriptions',
    tag: 'Reminders',
    summary: 'Have reminders pushed to this browser',
    access: 'signed-in',
    body: pushSubscriptionSchema,
    success: { status: 204, description: 'Kept. A push address another account had moves to this one.' },
    refusals: { 422: 'The push address does not use https (code invalid).' },
  },
  {
    method: 'delete',
    path: '/api/account/push-subscriptions',
    tag: 'Reminders',
    summary: 'Stop pushes to a browser',
    access: 'signed-in',
    body: pushUnsubscribeSchema,
    success: { status: 204, description: 'Forgotten (also when it was not known).' },
  },
];
