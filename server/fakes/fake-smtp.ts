import type { AddressInfo } from 'node:net';
import type { Knex } from 'knex';
import { SMTPServer } from 'smtp-server';

export interface FakeSmtp {
  env: Record<string, string>;
  stop(): Promise<void>;
}

// A loopback SMTP service for npm start and tests: it accepts every message and
// keeps it in mail_outbox (read by the admin Outbox page). Nothing leaves the machine.
export async function startFakeSmtp(options: { db: Knex; host?: string; port?: number }): Promise<FakeSmtp> {
  const { db, host = '127.0.0.1' } = options;
  const server = new SMTPServer({
    authOptional: true,
    disabledCommands: ['AUTH', 'STARTTLS'],
    banner: 'Crosswatt fake SMTP',
    logger: false,
    size: 1024 * 1024,
    onData(stream, session, callback) {
      const chunks: Buffer[] = [];
      stream.on('data', (chunk: Buffer) => chunks.push(chunk));
      stream.on('end', () => {
        const raw = Buffer.concat(chunks).toString('utf8');
        const parsed = parseMessage(raw);
        db('mail_outbox')
          .insert({
            mail_from: session.envelope.mailFrom ? session.envelope.mailFrom.address : '',
            recipients: session.envelope.rcptTo.map((r) => r.address),
            subject: parsed.subject,
            text_body: parsed.text,
            headers: JSON.stringify(parsed.headers),
            raw,
          })
          .then(
            () => callback(),
            (err: Error) => callback(err),
          );
      });
    },
  });
  await new Promise<void>((resolve, reject) => {
    server.once('error', reject);
    server.listen(options.port ?? 0, host, () => resolve());
  });
  const { port } = server.server.address() as AddressInfo;
  return {
    env: { SMTP_HOST: host, SMTP_PORT: String(port), SMTP_SECURE: 'false' },
    stop: () => new Promise<void>((resolve) => server.close(() => resolve())),
  };
}

/** Just enough MIME for the single-part text messages Crosswatt sends. */
export function parseMessage(raw: string): { headers: Record<string, string>; subject: string; text: string } {
  const split = raw.search(/\r?\n\r?\n/);
  const head = split === -1 ? raw : raw.slice(0, split);
  const body = split === -1 ? '' : raw.slice(split).replace(/^\r?\n\r?\n/, '');
  const headers: Record<string, string> = {};
  for (const line of head.replace(/\r?\n[ \t]+/g, ' ').split(/\r?\n/)) {
    const colon = line.indexOf(':');
    if (colon > 0) headers[line.slice(0, colon).trim().toLowerCase()] = line.slice(colon + 1).trim();
  }
  const encoding = (headers['content-transfer-encoding'] ?? '7bit').toLowerCase();
  const text =
    encoding === 'base64'
      ? Buffer.from(body.replace(/\s+/g, ''), 'base64').toString('utf8')
      : encoding === 'quoted-printable'
        ? decodeQuotedPrintable(body)
        : body;
  return { headers, subject: decodeEncodedWords(headers.subject ?? ''), text: text.replace(/\r\n/g, '\n') };
}

function decodeQuotedPrintable(text: string): string {
  const bytes = text.replace(/=\r?\n/g, '').replace(/=([0-9A-F]{2})/gi, (_m, hex: string) => `%${hex}`);
  try {
    return decodeURIComponent(bytes.replace(/%(?![0-9A-F]{2})/gi, '%25'));
  } catch {
    return bytes;
  }
}

// RFC 2047 encoded words, as nodemailer writes non-ASCII subjects.
function decodeEncodedWords(value: string): string {
  return value
    .replace(/\?=\s+=\?/g, '?==?')
    .replace(/=\?([^?]+)\?([BQbq])\?([^?]*)\?=/g, (_m, _charset: string, kind: string, data: string) =>
      kind.toUpperCase() === 'B' ? Buffer.from(data, 'base64').toString('utf8') : decodeQuotedPrintable(data.replace(/_/g, ' ')),
    );
}
