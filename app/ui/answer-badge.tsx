// A line's answer from the customer, in colour, words and shape: approved, declined, or waiting.
export function AnswerBadge({ answer }: { answer: "approved" | "declined" | "no_answer" | "added" | null | undefined }) {
  if (answer === "approved")
    return (
      <span className="font-bold whitespace-nowrap text-pass" data-testid="answer-badge">
        ✔ Approved
      </span>
    );
  if (answer === "declined")
    return (
      <span className="font-bold whitespace-nowrap text-fail" data-testid="answer-badge">
        ✖ Declined — not billed
      </span>
    );
  if (answer === "added")
    return (
      <span className="font-bold whitespace-nowrap text-steel-900" data-testid="answer-badge">
        + Fitted, added by the workshop
      </span>
    );
  return (
    <span className="font-bold whitespace-nowrap text-warn" data-testid="answer-badge">
      … Waiting for the customer
    </span>
  );
}
