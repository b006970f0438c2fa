import "server-only";
// The queues of deferred work (pg-boss, schema "pgboss" in the app's own database).
export const QUEUES = {
  /** One job per e-mail of the outbox (data: { mailId }); the job id is the e-mail's id. */
  mail: "mail-send",
  /** Turns waiting sign-off notices into supervisor e-mails (sent after a sync merge). */
  reviewNotices: "review-notices",
  /** Every ten minutes: reminders that have come due become e-mails (data: { asOf? } an ISO instant, for tests). */
  reminders: "reminders-due",
  /** Every minute: notices left waiting and e-mails whose job was lost are handed on again. */
  sweep: "queue-sweep",
} as const;

/** Retries of a failed e-mail: 30 s, 1, 2, 4 and 8 minutes after the first try (pg-boss retryBackoff doubles the delay). */
export const MAIL_RETRY = { retryLimit: 5, retryDelay: 30, retryBackoff: true } as const;

/** When the reminders job runs (cron, UTC): every ten minutes, so a reminder goes out early on its day. */
export const REMINDERS_CRON = "*/10 * * * *";
