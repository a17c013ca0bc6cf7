import { simpleParser } from 'mailparser';
import type { AddressInfo } from 'node:net';
import { SMTPServer } from 'smtp-server';

export interface SunkMessage {
  id: number;
  receivedAt: string;
  from: string;
  to: string[];
  subject: string;
  text: string;
  html: string;
}

/**
 * A local SMTP server on 127.0.0.1 that keeps every message it is given: the development
 * mailbox and the tests' window on what Benchtide sends. It never relays anything.
 */
export class MailSink {
  readonly messages: SunkMessage[] = [];
  private readonly waiters: (() => void)[] = [];
  private readonly server: SMTPServer;
  port = 0;

  constructor(private readonly onMessage?: (message: SunkMessage) => void) {
    this.server = new SMTPServer({
      authOptional: true,
      disabledCommands: ['STARTTLS'],
      logger: false,
      onData: (stream, session, callback) => {
        simpleParser(stream)
          .then((parsed) => {
            const message: SunkMessage = {
              id: this.messages.length + 1,
              receivedAt: new Date().toISOString(),
              from: parsed.from?.text ?? '',
              to: (session.envelope.rcptTo ?? []).map((rcpt) => rcpt.address.toLowerCase()),
              subject: parsed.subject ?? '',
              text: parsed.text ?? '',
              html: typeof parsed.html === 'string' ? parsed.html : '',
            };
            this.messages.push(message);
            this.onMessage?.(message);
            this.waiters.splice(0).forEach((wake) => wake());
            callback();
          })
          .catch((error: Error) => callback(error));
      },
    });
  }

  listen(port = 0): Promise<number> {
    return new Promise((resolve, reject) => {
      this.server.once('error', reject);
      this.server.listen(port, '127.0.0.1', () => {
        this.port = (this.server.server.address() as AddressInfo).port;
        resolve(this.port);
      });
    });
  }

  close(): Promise<void> {
    return new Promise((resolve) => this.server.close(() => resolve()));
  }

  /** The newest message to an address matching the test, waiting for it up to a limit. */
  async waitFor(
    to: string,
    test: (message: SunkMessage) => boolean = () => true,
    timeoutMs = 5000,
  ): Promise<SunkMessage> {
    const deadline = Date.now() + timeoutMs;
    for (;;) {
      const found = [...this.messages]
        .reverse()
        .find((message) => message.to.includes(to.toLowerCase()) && test(message));
      if (found) return found;
      const left = deadline - Date.now();
      if (left <= 0) throw new Error(`no message to ${to} arrived within ${timeoutMs} ms`);
      await new Promise<void>((resolve) => {
        const timer = setTimeout(resolve, left);
        this.waiters.push(() => {
          clearTimeout(timer);
          resolve();
        });
      });
    }
  }
}

/** The first link in a message that leads into the app. */
export function linkIn(message: SunkMessage): string {
  const match = /https?:\/\/\S+/.exec(message.text);
  if (!match) throw new Error(`no link in "${message.subject}"`);
  return match[0];
}
