import nodemailer from 'nodemailer';

/** One message to send. */
export interface OutgoingMail {
  /** Recipient address. */
  to: string;
  /** Subject line. */
  subject: string;
  /** Plain-text body. */
  text: string;
  /** The shop the message is sent for; kept in a header so captured mail stays per shop. */
  shopId: string;
}

/** Sends mail. */
export interface Mailer {
  /** Sends one message; rejects when the SMTP server refuses it. */
  send(mail: OutgoingMail): Promise<void>;
  /** Closes pooled connections. */
  close(): void;
}

/** The header that names the shop a message was sent for. */
export const SHOP_HEADER = 'X-Cellsmith-Shop';

/** A mailer that sends through the SMTP server at `smtpUrl` with nodemailer. */
export function createSmtpMailer(smtpUrl: string, from: string): Mailer {
  const transport = nodemailer.createTransport(smtpUrl);
  return {
    async send(mail) {
      await transport.sendMail({
        from,
        to: mail.to,
        subject: mail.subject,
        text: mail.text,
        headers: { [SHOP_HEADER]: mail.shopId },
      });
    },
    close() {
      transport.close();
    },
  };
}
