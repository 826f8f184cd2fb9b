import nodemailer, { type Transporter } from 'nodemailer';

/** How to reach the mail server: any SMTP service in production, the local catcher in development and tests. */
export type SmtpSettings = {
  host: string;
  port: number;
  /** TLS from the first byte (port 465). Otherwise nodemailer upgrades with STARTTLS when the server offers it. */
  secure: boolean;
  user?: string | undefined;
  password?: string | undefined;
  /** The sender, e.g. `Kerfline <kerfline@plant.example>`. */
  from: string;
};

export type OutgoingMessage = { to: string; subject: string; html: string; text: string };

export type MailSender = {
  send(message: OutgoingMessage): Promise<{ messageId: string }>;
  close(): void;
};

/** One pooled SMTP connection per process; a failed send rejects with the server's or the network's error. */
export function createMailSender(settings: SmtpSettings): MailSender {
  const transport: Transporter = nodemailer.createTransport({
    host: settings.host,
    port: settings.port,
    secure: settings.secure,
    auth: settings.user ? { user: settings.user, pass: settings.password ?? '' } : undefined,
    pool: true,
    maxConnections: 2,
    connectionTimeout: 10_000,
    greetingTimeout: 10_000,
    socketTimeout: 30_000,
  });
  return {
    async send(message) {
      const info = await transport.sendMail({ from: settings.from, ...message });
      return { messageId: String(info.messageId ?? '') };
    },
    close: () => transport.close(),
  };
}
