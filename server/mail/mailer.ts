import nodemailer from 'nodemailer';
import type { Config } from '../config';

export interface OutgoingMail {
  to: string | string[];
  subject: string;
  text: string;
  html: string;
}

export interface Mailer {
  send(mail: OutgoingMail): Promise<void>;
}

export function createMailer(config: Config): Mailer {
  const transport = nodemailer.createTransport({
    host: config.mail.host,
    port: config.mail.port,
    secure: false,
    ignoreTLS: true, // the catcher on loopback speaks plain SMTP
  });
  return {
    async send(mail) {
      await transport.sendMail({ from: config.mail.from, ...mail });
    },
  };
}
