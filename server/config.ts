import { resolve } from 'node:path';

export interface ServerConfig {
  port: number;
  host: string;
  databaseUrl: string;
  production: boolean;
  logLevel: string;
  /** Folder of the production build of the app; the API runs without it. */
  appDir: string;
  trustProxy: boolean;
  /** The address people reach the app at; links in e-mails point there. */
  publicOrigin: string;
  /** Session cookies are Secure when the app is served over HTTPS. */
  secureCookies: boolean;
  smtpUrl: string;
  mailFrom: string;
}

const DEFAULT_DATABASE_URL = 'postgres://benchtide@127.0.0.1:54329/benchtide';

export function readConfig(env: NodeJS.ProcessEnv = process.env): ServerConfig {
  const port = Number(env['PORT'] ?? 3000);
  if (!Number.isInteger(port) || port < 0 || port > 65535) {
    throw new Error(`PORT must be a whole number from 0 to 65535, not "${env['PORT']}"`);
  }
  return {
    port,
    host: env['HOST'] ?? '127.0.0.1',
    databaseUrl: env['DATABASE_URL'] ?? DEFAULT_DATABASE_URL,
    production: env['NODE_ENV'] === 'production',
    logLevel: env['LOG_LEVEL'] ?? 'info',
    appDir: resolve(env['BENCHTIDE_APP_DIR'] ?? 'dist/benchtide/browser'),
    trustProxy: env['TRUST_PROXY'] === '1',
    publicOrigin: (env['PUBLIC_ORIGIN'] ?? `http://${env['HOST'] ?? '127.0.0.1'}:${port}`).replace(/\/$/, ''),
    secureCookies: (env['PUBLIC_ORIGIN'] ?? '').startsWith('https://'),
    smtpUrl: env['SMTP_URL'] ?? 'smtp://127.0.0.1:2525',
    mailFrom: env['MAIL_FROM'] ?? 'Benchtide <no-reply@benchtide.test>',
  };
}
