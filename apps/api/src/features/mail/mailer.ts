import nodemailer from 'nodemailer';

export interface OutgoingMail {
  to: string | string[];
  subject: string;
  text: string;
  html?: string;
}

export interface Mailer {
  send(mail: OutgoingMail): Promise<void>;
}

/** Sends through SMTP: the local stand-in in development and tests, a real relay in production. */
export function createSmtpMailer(options: { host: string; port: number; from: string }): Mailer {
  const transport = nodemailer.createTransport({
    host: options.host,
    port: options.port,
    secure: false,
    ignoreTLS: true,
  });
  return {
    async send(mail) {
      await transport.sendMail({ from: options.from, ...mail });
    },
  };
}
