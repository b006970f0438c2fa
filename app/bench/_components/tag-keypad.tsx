"use client";

import { useState } from "react";
import { BigButton } from "./big-button";

const KEYS = [..."1234567890", ..."ABCDEFGHIJKLMNOPQRSTUVWXYZ", "-"];

/** A large on-screen keypad for typing a tag code with gloves on (no system keyboard). */
export function TagKeypad({ onSubmit, busy }: { onSubmit: (code: string) => void; busy: boolean }) {
  const [code, setCode] = useState("");
  return (
    <div className="flex flex-col gap-3">
      <div className="flex items-stretch gap-3">
        <output
          aria-label="Tag code"
          data-testid="tag-display"
          className="flex min-h-target flex-1 items-center rounded-xl border-4 border-steel-900 bg-white px-4 font-mono text-3xl tracking-widest"
        >
          {code || <span className="text-steel-500">tag code</span>}
        </output>
        <BigButton tone="plain" aria-label="Delete last character" onClick={() => setCode((c) => c.slice(0, -1))}>
          ⌫
        </BigButton>
        <BigButton tone="plain" aria-label="Clear the tag code" onClick={() => setCode("")}>
          Clear
        </BigButton>
      </div>
      <div className="grid grid-cols-10 gap-2">
        {KEYS.map((k) => (
          <button
            key={k}
            type="button"
            aria-label={`Key ${k}`}
            onClick={() => setCode((c) => (c.length < 24 ? c + k : c))}
            className="min-h-target rounded-lg border-2 border-steel-700 bg-white font-mono text-2xl font-bold active:bg-signal"
          >
            {k}
          </button>
        ))}
      </div>
      <BigButton tone="go" disabled={busy || !code} onClick={() => onSubmit(code)}>
        {busy ? "Looking up…" : "Open this bike's job"}
      </BigButton>
    </div>
  );
}
