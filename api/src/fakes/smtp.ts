// Local SMTP stand-in: accepts every message on loopback and writes it as an .eml file to the
// mailbox folder, where the development mailbox page and the tests read it back.
import { randomUUID } from 'node:crypto';
import { mkdir, readdir, readFile, writeFile } from 'node:fs/promises';
import { join } from 'node:path';
import { simpleParser } from 'mailparser';
import { SMTPServer } from 'smtp-server';

/** Starts the fake on 127.0.0.1:`port` (0 = any free port); resolves with the server and its port. */
export async function startFakeSmtp(port: number, mailboxDir: string): Promise<{ server: SMTPServer; port: number }> {
  await mkdir(mailboxDir, { recursive: true });
  const server = new SMTPServer({
    authOptional: true,
    disabledCommands: ['STARTTLS'],
    logger: false,
    size: 10 * 1024 * 1024,
    onData(stream, _session, callback) {
      const chunks: Buffer[] = [];
      stream.on('data', (c: Buffer) => chunks.push(c));
      stream.on('end', () => {
        const name = `${new Date().toISOString().replace(/[:.]/g, '-')}-${randomUUID()}.eml`;
        // mkdir each time: a test may have emptied the mailbox folder while the server runs.
        mkdir(mailboxDir, { recursive: true })
          .then(() => writeFile(join(mailboxDir, name), Buffer.concat(chunks)))
          .then(() => callback(), callback);
      });
    },
  });
  return new Promise((resolve, reject) => {
    server.on('error', reject);
    server.listen(port, '127.0.0.1', () => {
      const addr = server.server.address();
      resolve({ server, port: typeof addr === 'object' && addr ? addr.port : port });
    });
  });
}

/** One captured message as the mailbox page shows it. */
export interface CapturedMail {
  id: string;
  from: string;
  to: string[];
  subject: string;
  date: string;
  text: string;
  html: string | null;
}

const ID_RE = /^[0-9TZ-]+-[0-9a-f-]{36}$/;

/** Reads captured messages, newest first; `id` is the file name without `.eml`. */
export async function listCapturedMail(mailboxDir: string, limit = 200): Promise<CapturedMail[]> {
  let names: string[];
  try {
    names = (await readdir(mailboxDir)).filter((n) => n.endsWith('.eml'));
  } catch {
    return [];
  }
  names.sort().reverse();
  return Promise.all(names.slice(0, limit).map((n) => readCapturedMail(mailboxDir, n.slice(0, -4)))).then((l) => l.filter((m): m is CapturedMail => !!m));
}

/** Reads one captured message by id, or null when the id is malformed or unknown. */
export async function readCapturedMail(mailboxDir: string, id: string): Promise<CapturedMail | null> {
  if (!ID_RE.test(id)) return null;
  let raw: Buffer;
  try {
    raw = await readFile(join(mailboxDir, `${id}.eml`));
  } catch {
    return null;
  }
  const parsed = await simpleParser(raw);
  const to = Array.isArray(parsed.to) ? parsed.to.flatMap((a) => a.value) : (parsed.to?.value ?? []);
  return {
    id,
    from: parsed.from?.text ?? '',
    to: to.map((a) => a.address ?? '').filter(Boolean),
    subject: parsed.subject ?? '',
    date: (parsed.date ?? new Date()).toISOString(),
    text: parsed.text ?? '',
    html: typeof parsed.html === 'string' ? parsed.html : null,
  };
}
