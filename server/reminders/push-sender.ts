import webpush from 'web-push';
import type { VapidKeys } from './vapid-keys.js';

export interface PushTarget {
  endpoint: string;
  p256dh: string;
  auth: string;
}

export interface ReminderMessage {
  title: string;
  body: string;
  /** Path in the app the notification opens, e.g. /builds/<id>?pour=<id>. */
  url: string;
}

/** sent; gone (the browser unsubscribed: forget it); or retry, with what went wrong. */
export type PushOutcome = { status: 'sent' } | { status: 'gone' } | { status: 'retry'; error: string };

/**
 * The payload the app's service worker shows as a notification (Angular's worker reads
 * `notification`, and opens `data.onActionClick.default.url` on a tap).
 */
export function notificationPayload(message: ReminderMessage, tag: string): string {
  return JSON.stringify({
    notification: {
      title: message.title,
      body: message.body,
      icon: '/icons/icon-192.png',
      tag,
      data: {
        url: message.url,
        onActionClick: { default: { operation: 'navigateLastFocusedOrOpen', url: message.url } },
      },
    },
  });
}

/**
 * Encrypts for the browser and signs with VAPID (web-push builds the request), then posts it.
 * Posting with fetch rather than web-push's own sender keeps one HTTP client in the server.
 */
export async function sendPush(
  target: PushTarget,
  payload: string,
  vapid: VapidKeys,
  subject: string,
): Promise<PushOutcome> {
  const request = webpush.generateRequestDetails(
    { endpoint: target.endpoint, keys: { p256dh: target.p256dh, auth: target.auth } },
    payload,
    { vapidDetails: { subject, ...vapid }, TTL: 6 * 3600, urgency: 'high' },
  );
  try {
    const response = await fetch(request.endpoint, {
      method: request.method,
      headers: request.headers as Record<string, string>,
      body: request.body ?? null,
      signal: AbortSignal.timeout(10_000),
    });
    if (response.ok) return { status: 'sent' };
    if (response.status === 404 || response.status === 410) return { status: 'gone' };
    return { status: 'retry', error: `the push service answered ${response.status}` };
  } catch (error) {
    return { status: 'retry', error: `the push service could not be reached (${(error as Error).message})` };
  }
}
