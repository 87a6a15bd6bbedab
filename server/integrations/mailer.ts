/** Outgoing mail through nodemailer over SMTP (the local fake mailbox unless SMTP_URL is set). */
import nodemailer from "nodemailer";

export interface OutgoingMail {
  from: string;
  to: string;
  subject: string;
  text: string;
  html?: string;
  attachments?: { filename: string; contentType: string; content: Buffer }[];
}

export interface Mailer {
  send(mail: OutgoingMail): Promise<void>;
  close(): void;
}

export function createSmtpMailer(smtpUrl: string): Mailer {
  const transport = nodemailer.createTransport(smtpUrl, {
    connectionTimeout: 10_000,
    greetingTimeout: 10_000,
    socketTimeout: 20_000,
  } as object);
  return {
    async send(mail) {
      await transport.sendMail(mail);
    },
    close() {
      transport.close();
    },
  };
}
