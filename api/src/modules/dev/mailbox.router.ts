import { readCapturedMail, listCapturedMail } from '../../fakes/smtp.ts';
import { AppError } from '../../errors.ts';
import type { ApiRoutes } from '../../routing.ts';

/**
 * The development mailbox: messages the local SMTP fake captured. Registered only when the fakes
 * run (never in production); open without sign-in so an invitee can read their invitation.
 */
export function registerMailboxRoutes(routes: ApiRoutes, deps: { mailboxDir: string }) {
  routes.get('/dev/mailbox', { access: 'public' }, async (_req, res) => {
    const mails = await listCapturedMail(deps.mailboxDir);
    res.json(mails.map(({ html, ...m }) => ({ ...m, hasHtml: !!html })));
  });
  routes.get('/dev/mailbox/:id/html', { access: 'public' }, async (req, res) => {
    const mail = await readCapturedMail(deps.mailboxDir, String(req.params.id));
    if (!mail?.html) throw new AppError('not_found', 'Message not found');
    // The captured HTML is untrusted: serve it sandboxed with no scripts.
    res.setHeader('Content-Security-Policy', "sandbox; default-src 'none'; style-src 'unsafe-inline'; img-src data:");
    res.type('html').send(mail.html);
  });
}
