import webpush from 'web-push';
import { startFakePushService, type FakePushService } from '../support/fake-push-service.js';

// The stand-in must accept what a real Web Push library sends and refuse what a push service would
// refuse, or the reminder specs built on it prove nothing. Sender: the web-push package (RFC 8291/8292)
// building the request, sent with fetch (web-push's own sender speaks only https).
async function send(
  subscription: webpush.PushSubscription,
  payload: string,
  options: webpush.RequestOptions,
): Promise<number> {
  const request = webpush.generateRequestDetails(subscription, payload, options);
  const response = await fetch(request.endpoint, {
    method: request.method,
    headers: request.headers as Record<string, string>,
    body: request.body ?? null,
  });
  return response.status;
}

describe('the stand-in push service', () => {
  let service: FakePushService;
  const vapid = webpush.generateVAPIDKeys();

  beforeEach(async () => {
    service = await startFakePushService();
  });
  afterEach(() => service.close());

  it('should decrypt a payload sent with VAPID to a subscription it made', async () => {
    const subscription = service.subscribe('phone');
    const status = await send(subscription, '{"title":"Layer 2 can go on"}', {
      vapidDetails: { subject: 'mailto:reminders@benchtide.invalid', ...vapid },
      TTL: 600,
    });
    expect(status).toBe(201);
    expect(service.received).toEqual([
      {
        device: 'phone',
        payload: '{"title":"Layer 2 can go on"}',
        subject: 'mailto:reminders@benchtide.invalid',
        ttl: 600,
      },
    ]);
  });

  it('should refuse a delivery signed with a key other than the one it names', async () => {
    const subscription = service.subscribe('phone');
    const other = webpush.generateVAPIDKeys();
    const headers = webpush.getVapidHeaders(
      service.origin,
      'mailto:a@b.invalid',
      vapid.publicKey,
      other.privateKey,
      'aes128gcm',
    );
    const response = await fetch(subscription.endpoint, {
      method: 'POST',
      headers: { Authorization: headers.Authorization, 'Content-Encoding': 'aes128gcm', TTL: '60' },
      body: 'x',
    });
    expect(response.status).toBe(401);
    expect(service.refused).toEqual(['VAPID signature does not match its key']);
    expect(service.received).toEqual([]);
  });

  it('should refuse a token made for another audience', async () => {
    const subscription = service.subscribe('phone');
    const headers = webpush.getVapidHeaders(
      'https://elsewhere.invalid',
      'mailto:a@b.invalid',
      vapid.publicKey,
      vapid.privateKey,
      'aes128gcm',
    );
    const response = await fetch(subscription.endpoint, {
      method: 'POST',
      headers: { Authorization: headers.Authorization, 'Content-Encoding': 'aes128gcm', TTL: '60' },
      body: 'x',
    });
    expect(response.status).toBe(401);
    expect(service.refused[0]).toContain('audience');
  });

  it('should refuse a body encrypted for other keys', async () => {
    const subscription = service.subscribe('phone');
    const stranger = service.subscribe('stranger');
    expect(
      await send({ ...subscription, keys: stranger.keys }, 'secret', {
        vapidDetails: { subject: 'mailto:a@b.invalid', ...vapid },
      }),
    ).toBe(400);
    expect(service.received).toEqual([]);
    expect(service.refused[0]).toContain('cannot decrypt');
  });
});
