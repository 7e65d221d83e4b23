// A local SMTP sink: the stand-in for a real mail relay in development and tests. Every message
// is parsed and kept as <dir>/<time>-<id>.json (and the raw .eml), newest last.
import crypto from 'node:crypto';
import fs from 'node:fs';
import path from 'node:path';
import { simpleParser } from 'mailparser';
import { SMTPServer } from 'smtp-server';

export interface SunkMessage {
  id: string;
  receivedAt: string;
  from: string;
  to: string[];
  subject: string;
  text: string;
}

export interface SmtpSink {
  port: number;
  dir: string;
  close(): Promise<void>;
}

export async function startSmtpSink(opts: { port: number; dir: string; host?: string }): Promise<SmtpSink> {
  fs.mkdirSync(opts.dir, { recursive: true });
  const server = new SMTPServer({
    disabledCommands: ['STARTTLS'],
    authOptional: true,
    logger: false,
    size: 10 * 1024 * 1024,
    onData(stream, session, callback) {
      const chunks: Buffer[] = [];
      stream.on('data', (c: Buffer) => chunks.push(c));
      stream.on('end', () => {
        const raw = Buffer.concat(chunks);
        simpleParser(raw)
          .then((mail) => {
            const id = crypto.randomBytes(6).toString('hex');
            const receivedAt = new Date().toISOString();
            const msg: SunkMessage = {
              id,
              receivedAt,
              from: session.envelope.mailFrom ? session.envelope.mailFrom.address : '',
              to: session.envelope.rcptTo.map((r) => r.address),
              subject: mail.subject ?? '',
              text: mail.text ?? '',
            };
            const base = path.join(opts.dir, `${receivedAt.replace(/[:.]/g, '-')}-${id}`);
            fs.writeFileSync(`${base}.eml`, raw);
            fs.writeFileSync(`${base}.json`, JSON.stringify(msg, null, 2));
            callback();
          })
          .catch((e: Error) => callback(e));
      });
    },
  });
  await new Promise<void>((resolve, reject) => {
    server.once('error', reject);
    server.listen(opts.port, opts.host ?? '127.0.0.1', () => resolve());
  });
  const addr = server.server.address();
  const port = typeof addr === 'object' && addr ? addr.port : opts.port;
  return { port, dir: opts.dir, close: () => new Promise((r) => server.close(() => r())) };
}

export function readSunkMessages(dir: string): SunkMessage[] {
  if (!fs.existsSync(dir)) return [];
  return fs
    .readdirSync(dir)
    .filter((f) => f.endsWith('.json'))
    .sort()
    .map((f) => JSON.parse(fs.readFileSync(path.join(dir, f), 'utf8')) as SunkMessage);
}

if (typeof require !== 'undefined' && require.main === module) {
  const port = Number(process.env.PARALLAX_SMTP_PORT ?? 2525);
  const dir = process.env.PARALLAX_MAIL_DIR ?? path.join(process.env.PARALLAX_DATA_DIR ?? path.resolve(__dirname, '../.data'), 'mail');
  startSmtpSink({ port, dir }).then(
    (s) => {
      console.log(`[mail] SMTP sink on 127.0.0.1:${s.port}, messages kept in ${dir}`);
      const stop = () => s.close().then(() => process.exit(0));
      process.once('SIGTERM', stop);
      process.once('SIGINT', stop);
    },
    (e: Error) => {
      console.error(`[mail] cannot start the SMTP sink: ${e.message}`);
      process.exit(1);
    },
  );
}
