// The development mailbox: an SMTP sink on 127.0.0.1 that keeps every message Benchtide sends,
// and a page listing them. Started by `npm start` and `npm run dev` when SMTP_URL is not set;
// never part of the API, so never mounted in production.
import express from 'express';
import { existsSync, mkdirSync, readFileSync, writeFileSync } from 'node:fs';
import { MailSink, type SunkMessage } from '../server/mail/mail-sink.js';

const SMTP_PORT = Number(process.env['BENCHTIDE_SMTP_PORT'] ?? 2525);
const PAGE_PORT = Number(process.env['BENCHTIDE_MAILBOX_PORT'] ?? 2580);
const STORE = '.data/mailbox.json';

const escape = (text: string) => text.replace(/[&<>"']/g, (c) => `&#${c.charCodeAt(0)};`);
const kept: SunkMessage[] = existsSync(STORE) ? (JSON.parse(readFileSync(STORE, 'utf8')) as SunkMessage[]) : [];

const sink = new MailSink((message) => {
  kept.push({ ...message, id: kept.length + 1 });
  mkdirSync('.data', { recursive: true });
  writeFileSync(STORE, JSON.stringify(kept, null, 1));
});
await sink.listen(SMTP_PORT);

const page = (title: string, body: string) =>
  `<!doctype html><html lang="en"><head><meta charset="utf-8"><title>${escape(title)}</title>` +
  '<meta name="viewport" content="width=device-width, initial-scale=1">' +
  '<style>body{font-family:system-ui,sans-serif;margin:24px;max-width:860px;color:#15191B;background:#F7F4EE}' +
  'a{color:#17606B}li{margin:8px 0}pre{white-space:pre-wrap;background:#fff;padding:12px;border-radius:8px}' +
  'iframe{width:100%;height:480px;border:1px solid #ccc;border-radius:8px;background:#fff}</style></head>' +
  `<body><p><strong>Benchtide development mailbox</strong> — messages are kept here, never delivered.</p>${body}</body></html>`;

const app = express();
app.get('/', (_req, res) => {
  const items = [...kept]
    .reverse()
    .map(
      (m) =>
        `<li><a href="/messages/${m.id}">${escape(m.subject)}</a> to ${escape(m.to.join(', '))} <small>${m.receivedAt}</small></li>`,
    )
    .join('');
  res.send(page('Mailbox', items ? `<ol reversed>${items}</ol>` : '<p>No messages yet.</p>'));
});
app.get('/messages/:id', (req, res) => {
  const message = kept.find((m) => m.id === Number(req.params['id']));
  if (!message) return void res.status(404).send(page('Not found', '<p>No such message. <a href="/">Back</a></p>'));
  res.send(
    page(
      message.subject,
      `<p><a href="/">All messages</a></p><h1>${escape(message.subject)}</h1><p>From ${escape(message.from)} to ${escape(message.to.join(', '))}</p>` +
        `<h2>HTML part</h2><iframe sandbox srcdoc="${escape(message.html)}"></iframe><h2>Text part</h2><pre>${escape(message.text)}</pre>`,
    ),
  );
});
app.listen(PAGE_PORT, '127.0.0.1', () => {
  console.log(`[mail] SMTP sink on 127.0.0.1:${SMTP_PORT}; mailbox at http://127.0.0.1:${PAGE_PORT}`);
});
