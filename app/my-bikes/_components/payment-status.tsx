// Where a customer's payment stands (a deposit or a bill's balance), in colour, mark and words:
// declined (nothing taken, try again), sent and waiting for the payment service, paid, or refunded.
export function PaymentStatus({
  status,
  sent,
  paidText,
  testId,
}: {
  /** The payment's status as stored (undefined: none started). */
  status: string | undefined;
  /** A payment was started from this page or is on file. */
  sent: boolean;
  paidText: string;
  testId: string;
}) {
  if (status === "failed")
    return (
      <p role="alert" className="text-lg font-bold text-fail" data-testid={testId}>
        ✖ The payment was declined; nothing was taken. You can try again.
      </p>
    );
  if (sent && status === "pending")
    return (
      <p role="status" className="text-lg font-bold text-warn" data-testid={testId}>
        … Payment sent; waiting for the payment service to confirm.
      </p>
    );
  if (status === "refunded")
    return (
      <p role="status" className="text-lg font-bold text-warn" data-testid={testId}>
        ↩ The payment was refunded in full by the workshop.
      </p>
    );
  if (status === "paid")
    return (
      <p role="status" className="text-lg font-bold text-pass" data-testid={testId}>
        ✔ {paidText}
      </p>
    );
  return null;
}
