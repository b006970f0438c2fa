// The answer to a dyno-page form, in words, colour and a sign: ✓ saved, ✕ refused (with why).
export interface FormOutcome {
  ok: boolean;
  text: string;
}

export function FormStatus({ message, testId }: { message: FormOutcome | null; testId?: string }) {
  if (!message) return null;
  return (
    <p
      role="status"
      data-testid={testId}
      className={`rounded px-3 py-2 text-lg font-bold ${message.ok ? "bg-pass-light text-pass" : "bg-fail-light text-fail"}`}
    >
      {message.ok ? "✓ " : "✕ "}
      {message.text}
    </p>
  );
}
