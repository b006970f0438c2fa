"use client";

import { useRouter } from "next/navigation";
import { useState } from "react";
import { api } from "@/app/ui/api-client";
import { quietButtonClass } from "@/app/ui/form-field";

// A button that posts one small JSON body (end sessions, clear a sign-in wait), then shows the
// page again from the server. A refusal is shown beside it in words.
export function PostButton({ url, body, label, ariaLabel }: { url: string; body: unknown; label: string; ariaLabel: string }) {
  const router = useRouter();
  const [error, setError] = useState<string | null>(null);
  const [busy, setBusy] = useState(false);
  return (
    <span className="flex flex-col items-start gap-1">
      <button
        type="button"
        disabled={busy}
        className={quietButtonClass}
        aria-label={ariaLabel}
        onClick={async () => {
          setError(null);
          setBusy(true);
          try {
            await api("POST", url, body);
            router.refresh();
          } catch (e) {
            setError((e as Error).message);
          } finally {
            setBusy(false);
          }
        }}
      >
        {label}
      </button>
      {error && <span className="font-bold text-fail">{error}</span>}
    </span>
  );
}
