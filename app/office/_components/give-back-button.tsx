"use client";

import { useRouter } from "next/navigation";
import { useState } from "react";
import { api } from "@/app/ui/api-client";
import { FormMessage, quietButtonClass } from "@/app/ui/form-field";

/**
 * Asks the payment provider to give back what is left of one line (app/api/office/give-backs/[id]/refund).
 * The line stays until the provider reports the refund; pressing again meanwhile asks nothing twice.
 */
export function GiveBackButton({ id, label }: { id: string; label: string }) {
  const router = useRouter();
  const [busy, setBusy] = useState(false);
  const [message, setMessage] = useState<{ ok?: string; error?: string }>({});
  async function ask() {
    setBusy(true);
    try {
      const r = await api<{ message: string }>("POST", `/api/office/give-backs/${id}/refund`);
      setMessage({ ok: r.message });
      router.refresh();
    } catch (e) {
      setMessage({ error: (e as Error).message });
    } finally {
      setBusy(false);
    }
  }
  return (
    <div className="mt-1 grid gap-1">
      <div>
        <button type="button" className={quietButtonClass} disabled={busy} onClick={() => void ask()}>
          {label}
        </button>
      </div>
      <FormMessage ok={message.ok} error={message.error} />
    </div>
  );
}
