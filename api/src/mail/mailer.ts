/** One outgoing message: plain text always, HTML optional (both rendered by the templates). */
export interface OutgoingMail {
  to: string;
  subject: string;
  text: string;
  html?: string;
}

export interface SentMail {
  messageId: string | null;
}

/** The port every module sends mail through; the nodemailer adapter implements it. */
export abstract class Mailer {
  abstract send(mail: OutgoingMail): Promise<SentMail>;
}
