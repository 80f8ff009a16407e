import nodemailer, { type Transporter } from 'nodemailer';
import type { Env } from '../config/env.ts';

/** A message with both parts; every Midgray e-mail has an HTML and a plain-text body. */
export interface OutgoingMail {
  to: string | string[];
  subject: string;
  text: string;
  html: string;
}

/** Sends mail through SMTP (the local fake in development and tests). */
export interface Mailer {
  send(mail: OutgoingMail): Promise<void>;
  close(): void;
}

/** Returns a nodemailer-backed Mailer from the environment's SMTP settings. */
export function createMailer(env: Pick<Env, 'SMTP_HOST' | 'SMTP_PORT' | 'SMTP_USER' | 'SMTP_PASS' | 'SMTP_SECURE' | 'MAIL_FROM'>): Mailer {
  const transport: Transporter = nodemailer.createTransport({
    host: env.SMTP_HOST,
    port: env.SMTP_PORT,
    secure: env.SMTP_SECURE,
    auth: env.SMTP_USER ? { user: env.SMTP_USER, pass: env.SMTP_PASS } : undefined,
    // The local fake speaks plain SMTP on loopback; a real server negotiates TLS itself.
    ignoreTLS: env.SMTP_HOST === '127.0.0.1' && !env.SMTP_USER,
  });
  return {
    async send(mail) {
      await transport.sendMail({ from: env.MAIL_FROM, ...mail });
    },
    close: () => transport.close(),
  };
}

const esc = (s: string) => s.replace(/[&<>"']/g, (c) => ({ '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;', "'": '&#39;' })[c]!);

/**
 * Lays out one notification in both parts: a heading, paragraphs, an action link and a footer.
 * All text is escaped for the HTML part.
 */
export function layoutMail(opts: { channelName: string; heading: string; paragraphs: string[]; action?: { label: string; url: string }; footer?: string }): { text: string; html: string } {
  const footer = opts.footer ?? `You get this because you are a member of ${opts.channelName} on Midgray.`;
  const text = [
    opts.heading,
    '',
    ...opts.paragraphs.flatMap((p) => [p, '']),
    ...(opts.action ? [`${opts.action.label}: ${opts.action.url}`, ''] : []),
    '--',
    `${opts.channelName} · Midgray`,
    footer,
  ].join('\n');
  const html = `<!doctype html><html><body style="font-family:sans-serif;color:#1c1c1a;background:#f4f4f2;padding:24px">
<div style="max-width:560px;margin:auto;background:#ffffff;border:1px solid #d6d6d2;border-radius:8px;padding:24px">
<p style="margin:0 0 4px;color:#55554f;font-size:13px">${esc(opts.channelName)} · Midgray</p>
<h1 style="font-size:20px;margin:0 0 16px">${esc(opts.heading)}</h1>
${opts.paragraphs.map((p) => `<p style="line-height:1.5">${esc(p)}</p>`).join('\n')}
${opts.action ? `<p><a href="${esc(opts.action.url)}" style="display:inline-block;background:#0e6b5c;color:#ffffff;padding:10px 16px;border-radius:6px;text-decoration:none">${esc(opts.action.label)}</a></p>` : ''}
<p style="color:#55554f;font-size:12px;border-top:1px solid #e4e4e0;padding-top:12px">${esc(footer)}</p>
</div></body></html>`;
  return { text, html };
}
