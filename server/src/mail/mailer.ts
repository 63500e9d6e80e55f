import nodemailer from 'nodemailer';

/** One message as the outbox hands it to the mail server. */
export interface MailMessage {
  to: string;
  subject: string;
  text: string;
  html: string | null;
  messageId: string;
}

export interface Mailer {
  send(message: MailMessage): Promise<void>;
  close(): void;
}

export interface SmtpSettings {
  host: string;
  port: number;
  from: string;
}

/**
 * Mail over SMTP with nodemailer: one connection per message (no pool), so a mail server that went
 * away and came back is simply reached again. Short timeouts: a stuck server delays only this round.
 */
export function smtpMailer({ host, port, from }: SmtpSettings): Mailer {
  const transport = nodemailer.createTransport({
    host,
    port,
    secure: false,
    connectionTimeout: 10_000,
    greetingTimeout: 10_000,
    socketTimeout: 30_000,
  });
  return {
    async send(message) {
      const info = await transport.sendMail({
        from,
        to: message.to,
        subject: message.subject,
        text: message.text,
        ...(message.html ? { html: message.html } : {}),
        messageId: message.messageId,
      });
      if (info.rejected.length > 0) throw new Error(`the mail server refused ${info.rejected.join(', ')}`);
    },
    close: () => transport.close(),
  };
}
