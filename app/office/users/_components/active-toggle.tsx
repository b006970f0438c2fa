"use client";

import { useRouter } from "next/navigation";
import { useState } from "react";
import { api } from "@/app/ui/api-client";
import { quietButtonClass } from "@/app/ui/form-field";

// Turns a sign-in off or on again. Nothing is deleted: the records it made keep their author.
export function ActiveToggle({ userId, active, name }: { userId: string; active: boolean; name: string }) {
  const router = useRouter();
  const [error, setError] = useState<string | null>(null);
  return (
    <span className="flex flex-col items-start gap-1">
      <button
        type="button"
        className={quietButtonClass}
        aria-label={`${active ? "Turn off" : "Turn on"} the sign-in of ${name}`}
        onClick={async () => {
          setError(null);
          try {
            await api("PUT", `/api/office/users/${userId}`, { active: !active });
            router.refresh();
          } catch (e) {
            setError((e as Error).message);
          }
        }}
      >
        {active ? "Turn off" : "Turn on"}
      </button>
      {error && <span className="font-bold text-fail">{error}</span>}
    </span>
  );
}
