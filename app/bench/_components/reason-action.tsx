"use client";

import { useEffect, useState } from "react";
import { REPEAT_TAP_WINDOW_MS } from "@/lib/bench/tap-guard";
import { storeFailureMessage } from "@/lib/client/not-saved";
import { checksSaid } from "@/lib/client/not-saved-words";
import { BigButton } from "./big-button";

/** True once `ms` have passed since the caller appeared: a confirm that shows up under a finger cannot be hit by the same tap. */
export function useSettled(ms = REPEAT_TAP_WINDOW_MS): boolean {
  const [settled, setSettled] = useState(false);
  useEffect(() => {
    const t = setTimeout(() => setSettled(true), ms);
    return () => clearTimeout(t);
  }, [ms]);
  return settled;
}

/** A refusal's message in workshop words, whether zod's or another error's. */
export function messageOf(e: unknown): string {
  return storeFailureMessage(e) ?? checksSaid(e) ?? (e instanceof Error ? e.message : String(e));
}

/**
 * Taking something back with a reason: a button that opens a small panel asking why, with the
 * action and "keep it" side by side. Used to withdraw an entry and to stop or cancel a timer.
 */
export function ReasonAction({
  open: openLabel,
  title,
  confirm,
  onConfirm,
  testId,
}: {
  /** The button that opens the panel, e.g. "Withdraw this bolt…". */
  open: string;
  /** What the panel asks, e.g. "Withdraw bolt 3, pass 2? It stays on the record, marked withdrawn." */
  title: string;
  /** The action button, e.g. "Withdraw it". */
  confirm: string;
  onConfirm: (reason: string) => Promise<void>;
  testId?: string;
}) {
  const [opened, setOpened] = useState(false);
  const [reason, setReason] = useState("");
  const [error, setError] = useState<string | null>(null);
  const [busy, setBusy] = useState(false);
  if (!opened) {
    return (
      <BigButton tone="plain" onClick={() => setOpened(true)} aria-expanded={false} data-testid={testId}>
        {openLabel}
      </BigButton>
    );
  }
  async function go() {
    const text = reason.trim();
    if (text.length < 3) {
      setError("Give the reason in a few words.");
      return;
    }
    setBusy(true);
    try {
      await onConfirm(text);
      setOpened(false);
      setReason("");
      setError(null);
    } catch (e) {
      setError(messageOf(e));
    } finally {
      setBusy(false);
    }
  }
  return (
    <div
      role="group"
      aria-label={title}
      className="flex flex-col gap-3 rounded-xl border-4 border-fail bg-fail-light p-3"
      data-testid={testId && `${testId}-panel`}
    >
      <p className="text-lg font-bold text-fail">{title}</p>
      <label className="flex flex-col gap-1 text-lg font-bold">
        Why (goes on the record)
        <input
          value={reason}
          onChange={(e) => setReason(e.target.value)}
          maxLength={500}
          className="min-h-target rounded-lg border-2 border-steel-700 bg-white px-3 text-lg font-normal"
        />
      </label>
      {error && (
        <p role="alert" className="font-bold text-fail">
          ✖ {error}
        </p>
      )}
      <div className="flex flex-wrap gap-4">
        <BigButton tone="danger" disabled={busy} onClick={() => void go()}>
          {confirm}
        </BigButton>
        <BigButton
          tone="plain"
          onClick={() => {
            setOpened(false);
            setError(null);
          }}
        >
          Keep it
        </BigButton>
      </div>
    </div>
  );
}
