/** A message the local mail fake received (`GET /api/dev/mailbox`, admin, newest first). */
export interface MailboxMessageDto {
  id: number;
  receivedAt: string;
  /** SMTP envelope: who the message was handed to. */
  envelope: { from: string; to: string[] };
  /** Header names (lower case) in the order they arrived, decoded values. */
  headers: Array<[name: string, value: string]>;
  from: string;
  to: string;
  subject: string;
  text: string;
  /** The message exactly as it arrived over SMTP. */
  raw: string;
}
