import type { Role } from '../../shared/account-schemas.js';
import type { MailMessage } from './mailer.js';

function escapeHtml(text: string): string {
  return text.replace(/[&<>"']/g, (c) => `&#${c.charCodeAt(0)};`);
}

/** One message in our voice: a greeting, what happened, the one thing to do, and what to ignore. */
function compose(to: string, subject: string, lines: string[], action?: { label: string; url: string }): MailMessage {
  const text = [...lines, ...(action ? ['', `${action.label}: ${action.url}`] : []), '', '— Benchtide'].join('\n');
  const paragraphs = lines.map((line) => `<p>${escapeHtml(line)}</p>`).join('');
  const button = action
    ? `<p><a href="${escapeHtml(action.url)}" style="display:inline-block;padding:12px 20px;border-radius:20px;background:#17606B;color:#F7F4EE;text-decoration:none;font-weight:600">${escapeHtml(action.label)}</a></p><p style="font-size:13px;color:#555">Or paste this address into your browser: ${escapeHtml(action.url)}</p>`
    : '';
  const html = `<!doctype html><html><body style="font-family:'Source Sans 3',Arial,sans-serif;background:#F7F4EE;color:#15191B;padding:24px"><div style="max-width:520px;margin:auto">${paragraphs}${button}<p>— Benchtide</p></div></body></html>`;
  return { to, subject, text, html };
}

export function verifyEmailMessage(to: string, name: string, url: string): MailMessage {
  return compose(
    to,
    'Confirm your e-mail for Benchtide',
    [
      `Hello ${name},`,
      'Someone (we hope you) opened a Benchtide account with this address. Confirm it and you can sign in and share your builds.',
      'The link works once, for 24 hours. If this was not you, ignore this message and nothing happens.',
    ],
    { label: 'Confirm my e-mail', url },
  );
}

export function alreadySignedUpMessage(to: string, name: string, signInUrl: string): MailMessage {
  return compose(
    to,
    'You already have a Benchtide account',
    [
      `Hello ${name},`,
      'Someone tried to open a new Benchtide account with this address, but you already have one. Nothing was changed.',
      'If it was you, sign in instead; if you have forgotten the password, ask for a new one on the sign-in page.',
    ],
    { label: 'Sign in', url: signInUrl },
  );
}

export function resetPasswordMessage(to: string, name: string, url: string): MailMessage {
  return compose(
    to,
    'Choose a new Benchtide password',
    [
      `Hello ${name},`,
      'You asked to choose a new password. Your builds and workshops stay as they are; every device will be signed out.',
      'The link works once, for 1 hour. If you did not ask, ignore this message: your password stays the same.',
    ],
    { label: 'Choose a new password', url },
  );
}

const ROLE_WORDS: Record<Role, string> = {
  owner: 'an owner (you can manage members and everything in it)',
  builder: 'a builder (you can log steps and pours)',
  viewer: 'a viewer (you can follow the builds)',
};

export function invitationMessage(to: string, inviter: string, workshop: string, role: Role, url: string): MailMessage {
  return compose(
    to,
    `${inviter} invites you to ${workshop} on Benchtide`,
    [
      `Hello,`,
      `${inviter} invites you to the workshop "${workshop}" on Benchtide as ${ROLE_WORDS[role]}.`,
      'The link works once, for 7 days. You can accept with an existing account or open a new one with this address.',
    ],
    { label: 'See the invitation', url },
  );
}

export function reminderMessage(to: string, title: string, body: string, url: string): MailMessage {
  return compose(
    to,
    title,
    [body, 'You get this because you asked for these reminders; change them in Benchtide under Account.'],
    { label: 'Open it in Benchtide', url },
  );
}
