// Outgoing mail through nodemailer. In development and tests the relay is the local SMTP sink.
import nodemailer from 'nodemailer';

export interface MailSettings {
  host: string;
  port: number;
  from: string;
  /** A real relay would use STARTTLS; the local sink offers none. */
  secure?: boolean;
}

export function mailSettingsFromEnv(env: NodeJS.ProcessEnv = process.env): MailSettings {
  return {
    host: env.PARALLAX_SMTP_HOST ?? '127.0.0.1',
    port: Number(env.PARALLAX_SMTP_PORT ?? 2525),
    from: env.PARALLAX_MAIL_FROM ?? 'Parallax <parallax@localhost>',
    secure: env.PARALLAX_SMTP_TLS === '1',
  };
}

export function createMailer(s: MailSettings) {
  const transport = nodemailer.createTransport({
    host: s.host,
    port: s.port,
    secure: false,
    ignoreTLS: !s.secure,
    requireTLS: !!s.secure,
  });
  return {
    send(to: string[], subject: string, text: string) {
      return transport.sendMail({ from: s.from, to, subject, text });
    },
    close: () => transport.close(),
  };
}
