"use client";

import { issuesOf } from "@/lib/zod-issues";
import { useState } from "react";
import type { z } from "zod";
import { ApiError, fieldErrors } from "./api-client";

interface FormMessageState {
  error?: string;
  ok?: string;
}

/**
 * The state of an office form checked with the server's zod schema before it is sent: problems by
 * field (from the schema here, or from the server's answer), one message line, and a busy flag.
 * `submit` checks `values`; when they pass it runs `send`, whose string (if any) is the "done" line.
 */
export function useCheckedForm() {
  const [errors, setErrors] = useState<Record<string, string>>({});
  const [message, setMessage] = useState<FormMessageState>({});
  const [busy, setBusy] = useState(false);

  async function submit<S extends z.ZodType>(
    schema: S,
    values: unknown,
    send: (data: z.output<S>) => Promise<string | void>,
  ): Promise<boolean> {
    const parsed = schema.safeParse(values);
    if (!parsed.success) {
      setErrors(fieldErrors(issuesOf(parsed.error)));
      setMessage({ error: "Check the marked fields." });
      return false;
    }
    setErrors({});
    setBusy(true);
    try {
      const ok = await send(parsed.data);
      setMessage(ok ? { ok } : {});
      return true;
    } catch (err) {
      if (err instanceof ApiError) setErrors(fieldErrors(err.issues));
      setMessage({ error: (err as Error).message });
      return false;
    } finally {
      setBusy(false);
    }
  }

  return { errors, message, busy, submit };
}
