/** One message as the development mail catcher stored it. */
export type CapturedMail = {
  id: string;
  /** ISO 8601, UTC. */
  receivedAt: string;
  from: string;
  /** Envelope recipients, lower-cased, so lookups by address need no case folding. */
  to: string[];
  subject: string;
  text: string;
  html: string;
};

export type OutgoingMail = {
  to: string;
  subject: string;
  text: string;
  html: string;
};
