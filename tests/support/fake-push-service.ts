/**
 * A stand-in push service on 127.0.0.1 for reminder tests: it hands out subscriptions made with the
 * test's own browser keys, checks each delivery's VAPID authorisation (RFC 8292: an ES256 JWT whose
 * audience is this origin, signed by the key in `k=`) and decrypts the aes128gcm body (RFC 8291) with
 * those keys, so a test sees exactly what a browser would have shown.
 */
import { createECDH, createPublicKey, randomBytes, verify, type ECDH } from 'node:crypto';
import { createServer, type Server } from 'node:http';
import type { AddressInfo } from 'node:net';
// http_ece ships no types; decrypt(buffer, params) is its documented API.
// @ts-expect-error -- untyped CommonJS module
import ece from 'http_ece';

export interface PushSubscriptionJson {
  endpoint: string;
  keys: { p256dh: string; auth: string };
}

export interface ReceivedPush {
  /** The name the subscription was made under. */
  device: string;
  /** The decrypted payload as text. */
  payload: string;
  /** The `sub` claim of the sender's VAPID token. */
  subject: string;
  ttl: number;
}

interface Device {
  ecdh: ECDH;
  authSecret: Buffer;
}

export interface FakePushService {
  readonly origin: string;
  /** A browser's subscription: its endpoint on this service and its public key and auth secret. */
  subscribe(device: string): PushSubscriptionJson;
  /** Deliveries accepted so far, in arrival order. */
  readonly received: ReceivedPush[];
  /** Deliveries refused, with why (bad or missing authorisation, undecryptable body). */
  readonly refused: string[];
  /** Answer this status to every delivery from now on (e.g. 410 for an expired subscription); null to accept again. */
  answerWith(status: number | null): void;
  /** Hold every accepted delivery's answer this long, like a slow push service (0 to answer at once). */
  answerAfter(ms: number): void;
  close(): Promise<void>;
}

const fromBase64Url = (text: string) => Buffer.from(text, 'base64url');

/** Checks a `vapid t=<jwt>, k=<key>` header for this origin; answers the subject or throws why not. */
function checkVapid(header: string | undefined, origin: string): string {
  const match = /^vapid t=([^,\s]+),\s*k=([^,\s]+)$/.exec(header ?? '');
  if (!match) throw new Error('no VAPID authorisation');
  const [, token, key] = match as unknown as [string, string, string];
  const [head, body, signature] = token.split('.');
  if (!head || !body || !signature) throw new Error('malformed VAPID token');
  const point = fromBase64Url(key);
  if (point.length !== 65 || point[0] !== 4) throw new Error('VAPID key is not an uncompressed P-256 point');
  const publicKey = createPublicKey({
    key: {
      kty: 'EC',
      crv: 'P-256',
      x: point.subarray(1, 33).toString('base64url'),
      y: point.subarray(33).toString('base64url'),
    },
    format: 'jwk',
  });
  const signed = verify(
    'sha256',
    Buffer.from(`${head}.${body}`),
    { key: publicKey, dsaEncoding: 'ieee-p1363' },
    fromBase64Url(signature),
  );
  if (!signed) throw new Error('VAPID signature does not match its key');
  const header_ = JSON.parse(fromBase64Url(head).toString('utf8')) as { alg?: string };
  if (header_.alg !== 'ES256') throw new Error('VAPID token is not ES256');
  const claims = JSON.parse(fromBase64Url(body).toString('utf8')) as { aud?: string; exp?: number; sub?: string };
  if (claims.aud !== origin) throw new Error(`VAPID audience ${claims.aud} is not ${origin}`);
  if (!claims.exp || claims.exp * 1000 < Date.now()) throw new Error('VAPID token has expired');
  if (claims.exp * 1000 > Date.now() + 24 * 3600 * 1000 + 60_000) throw new Error('VAPID token lives over 24 hours');
  if (!claims.sub || !/^(mailto:|https:)/.test(claims.sub)) throw new Error('VAPID subject is not mailto: or https:');
  return claims.sub;
}

export async function startFakePushService(): Promise<FakePushService> {
  const devices = new Map<string, Device>();
  const received: ReceivedPush[] = [];
  const refused: string[] = [];
  let forcedStatus: number | null = null;
  let answerDelayMs = 0;
  let origin = '';

  const server: Server = createServer((req, res) => {
    const chunks: Buffer[] = [];
    req.on('data', (chunk: Buffer) => chunks.push(chunk));
    req.on('end', () => {
      const refuse = (status: number, why: string) => {
        refused.push(why);
        res.writeHead(status).end(why);
      };
      const name = decodeURIComponent((req.url ?? '').replace(/^\/push\//, ''));
      const device = devices.get(name);
      if (req.method !== 'POST' || !device) return refuse(404, `no subscription ${name}`);
      if (forcedStatus !== null) return refuse(forcedStatus, `answered ${forcedStatus} as told`);
      let subject: string;
      try {
        subject = checkVapid(req.headers.authorization, origin);
      } catch (error) {
        return refuse(401, (error as Error).message);
      }
      if (req.headers['content-encoding'] !== 'aes128gcm') return refuse(415, 'body is not aes128gcm');
      try {
        const plain: Buffer = ece.decrypt(Buffer.concat(chunks), {
          version: 'aes128gcm',
          privateKey: device.ecdh,
          authSecret: device.authSecret,
        });
        received.push({ device: name, payload: plain.toString('utf8'), subject, ttl: Number(req.headers['ttl']) });
        setTimeout(() => res.writeHead(201).end(), answerDelayMs);
      } catch (error) {
        refuse(400, `cannot decrypt: ${(error as Error).message}`);
      }
    });
  });
  await new Promise<void>((resolve) => server.listen(0, '127.0.0.1', resolve));
  origin = `http://127.0.0.1:${(server.address() as AddressInfo).port}`;

  return {
    origin,
    received,
    refused,
    subscribe(device) {
      const ecdh = createECDH('prime256v1');
      ecdh.generateKeys();
      const authSecret = randomBytes(16);
      devices.set(device, { ecdh, authSecret });
      return {
        endpoint: `${origin}/push/${encodeURIComponent(device)}`,
        keys: { p256dh: ecdh.getPublicKey().toString('base64url'), auth: authSecret.toString('base64url') },
      };
    },
    answerWith(status) {
      forcedStatus = status;
    },
    answerAfter(ms) {
      answerDelayMs = ms;
    },
    close: () => new Promise<void>((resolve) => server.close(() => resolve())),
  };
}

/** Keys a browser would send with a subscription (a fresh P-256 key pair's public half and a 16-byte secret). */
export function browserKeys(): PushSubscriptionJson['keys'] {
  const ecdh = createECDH('prime256v1');
  ecdh.generateKeys();
  return { p256dh: ecdh.getPublicKey().toString('base64url'), auth: randomBytes(16).toString('base64url') };
}
