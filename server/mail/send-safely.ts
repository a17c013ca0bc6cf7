import type { ServerContext } from '../context.js';
import type { MailMessage } from './mailer.js';

/**
 * Sends a message without letting a mail outage change the answer: the answer must not differ
 * between addresses (no account enumeration), and the person can ask for the message again.
 */
export async function sendSafely(ctx: ServerContext, message: MailMessage): Promise<void> {
  try {
    await ctx.mailer.send(message);
  } catch (error) {
    ctx.log.error({ err: error, subject: message.subject }, 'could not send an e-mail');
  }
}
