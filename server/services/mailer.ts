import nodemailer from 'nodemailer';
import type { Env } from '../env';

export interface OutgoingMail {
  to: string | string[];
  subject: string;
  text: string;
  html?: string;
  replyTo?: string;
  attachments?: { filename: string; content: Buffer; contentType?: string }[];
}

export interface SentMail {
  messageId: string;
  accepted: string[];
  rejected: string[];
}

export interface Mailer {
  readonly from: string;
  send(message: OutgoingMail): Promise<SentMail>;
  /** Opens an SMTP connection and checks the greeting (and login, if any). */
  verify(options?: { timeoutMs?: number }): Promise<void>;
  close(): void;
}

export type MailerSettings = Pick<
  Env,
  'SMTP_HOST' | 'SMTP_PORT' | 'SMTP_SECURE' | 'SMTP_IGNORE_TLS' | 'SMTP_USER' | 'SMTP_PASS' | 'MAIL_FROM'
>;

export function createMailer(settings: MailerSettings): Mailer {
  const transport = nodemailer.createTransport({
    host: settings.SMTP_HOST,
    port: settings.SMTP_PORT,
    secure: settings.SMTP_SECURE,
    // The local fake SMTP server offers no STARTTLS; a real relay does.
    ignoreTLS: settings.SMTP_IGNORE_TLS,
    auth: settings.SMTP_USER ? { user: settings.SMTP_USER, pass: settings.SMTP_PASS } : undefined,
    connectionTimeout: 10_000,
    greetingTimeout: 10_000,
    socketTimeout: 30_000,
  });

  return {
    from: settings.MAIL_FROM,

    async send(message) {
      const info = await transport.sendMail({ from: settings.MAIL_FROM, ...message });
      return {
        messageId: info.messageId,
        accepted: info.accepted.map(String),
        rejected: info.rejected.map(String),
      };
    },

    async verify(options = {}) {
      const timeoutMs = options.timeoutMs ?? 3_000;
      let timer: NodeJS.Timeout | undefined;
      const timeout = new Promise<never>((_, reject) => {
        timer = setTimeout(() => reject(new Error(`The SMTP server did not answer within ${timeoutMs} ms.`)), timeoutMs);
      });
      try {
        await Promise.race([transport.verify(), timeout]);
      } finally {
        clearTimeout(timer);
      }
    },

    close() {
      transport.close();
    },
  };
}
