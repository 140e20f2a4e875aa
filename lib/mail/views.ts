import type { MailKind, MailStatus } from '@/models/MailDelivery';

/** An e-mail Takeproof sent (a delivery) as the API and pages show it; safe to import from client components. */
export interface DeliveryView {
  id: number;
  kind: MailKind;
  recipients: string[];
  subject: string;
  status: MailStatus;
  messageId: string | null;
  error: string | null;
  attempts: number;
  sentBy: string | null;
  sentAt: string | null;
  /** For a queued e-mail that failed before: when a worker tries it again. */
  nextAttemptAt: string | null;
  createdAt: string;
}


/** A message the local mail catcher saved, as the outbox page lists it. */
export interface OutboxSummary {
  id: string;
  receivedAt: string;
  from: string;
  to: string[];
  subject: string;
  attachments: { filename: string; contentType: string; size: number }[];
}

export interface OutboxMessage extends OutboxSummary {
  text: string;
}
