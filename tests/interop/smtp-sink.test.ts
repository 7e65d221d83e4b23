// Real SMTP: nodemailer (our mailer) → the local sink over TCP on loopback.
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createMailer } from '../../server/mail';
import { readSunkMessages, startSmtpSink, type SmtpSink } from '../../scripts/smtp-sink';

let sink: SmtpSink;
beforeAll(async () => {
  sink = await startSmtpSink({ port: 0, dir: fs.mkdtempSync(path.join(os.tmpdir(), 'px-mail-')) });
});
afterAll(() => sink.close());

describe('SMTP sink', () => {
  it('receives, parses and keeps a message sent by the mailer', async () => {
    const mailer = createMailer({ host: '127.0.0.1', port: sink.port, from: 'Parallax <parallax@localhost>' });
    await mailer.send(['ops@example.test'], 'Checkout journey failing', 'Responder note: look at the payment queue first.');
    mailer.close();
    const msgs = readSunkMessages(sink.dir);
    expect(msgs).toHaveLength(1);
    expect(msgs[0]).toMatchObject({ from: 'parallax@localhost', to: ['ops@example.test'], subject: 'Checkout journey failing' });
    expect(msgs[0]!.text).toContain('payment queue first');
    expect(fs.readdirSync(sink.dir).filter((f) => f.endsWith('.eml'))).toHaveLength(1);
  });
});
