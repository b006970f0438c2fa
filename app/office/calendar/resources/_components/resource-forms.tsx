"use client";

import { useState } from "react";
import { api } from "@/app/ui/api-client";
import { buttonClass, inputClass } from "@/app/ui/form-field";
import { ReasonAction } from "@/app/ui/reason-action";
import { Outcome, useSubmit } from "@/app/ui/use-submit";
import { RESOURCE_KIND_LABELS, RESOURCE_KINDS, WEEKDAY_LABELS } from "@/lib/calendar/rules";

// The forms of the resources page. Every refusal comes back from the server in workshop words and
// is shown as it is; nothing is kept in the page that the server did not store.

const label = "flex flex-col gap-1 text-base font-bold";

export function OpeningHoursForm(props: { opensAt: string; closesAt: string; openDays: number[] }) {
  const s = useSubmit(async (f) => {
    await api("PUT", "/api/office/opening-hours", {
      opensAt: String(f.get("opensAt") ?? ""),
      closesAt: String(f.get("closesAt") ?? ""),
      openDays: f.getAll("openDays").map(Number),
    });
    return "Opening hours saved.";
  });
  return (
    <form
      noValidate
      data-testid="hours-form"
      onSubmit={s.onSubmit}
      className="mt-3 grid gap-4 rounded-xl border-2 border-steel-700 bg-white p-4 md:grid-cols-2"
    >
      <label className={label}>
        Opens at
        <input name="opensAt" type="time" defaultValue={props.opensAt} className={inputClass} />
      </label>
      <label className={label}>
        Closes at
        <input name="closesAt" type="time" defaultValue={props.closesAt} className={inputClass} />
      </label>
      <fieldset className="md:col-span-2">
        <legend className="text-base font-bold">Open on</legend>
        <div className="mt-1 flex flex-wrap gap-3">
          {WEEKDAY_LABELS.map((name, i) => (
            <label key={name} className="flex min-h-12 items-center gap-2 rounded-lg border-2 border-steel-300 px-3 text-lg">
              <input type="checkbox" name="openDays" value={i + 1} defaultChecked={props.openDays.includes(i + 1)} className="h-6 w-6" />
              {name}
            </label>
          ))}
        </div>
      </fieldset>
      <button type="submit" disabled={s.busy} className={`${buttonClass} md:col-span-2 md:justify-self-start`}>
        Save opening hours
      </button>
      <Outcome error={s.error} ok={s.ok} testId="hours" />
    </form>
  );
}

export function AddResourceForm({ mechanics }: { mechanics: Array<{ id: string; name: string }> }) {
  const [kind, setKind] = useState<string>("bay");
  const s = useSubmit(async (f) => {
    const name = String(f.get("name") ?? "");
    const userId = String(f.get("userId") ?? "");
    await api("POST", "/api/office/resources", { kind, name, ...(kind === "mechanic" && userId ? { userId } : {}) });
    return `${name.trim()} added: it can be booked now.`;
  });
  return (
    <form
      noValidate
      data-testid="add-resource-form"
      onSubmit={s.onSubmit}
      className="mt-3 grid gap-4 rounded-xl border-2 border-steel-700 bg-white p-4 md:grid-cols-2"
    >
      <label className={label}>
        Kind
        <select name="kind" value={kind} onChange={(e) => setKind(e.target.value)} className={inputClass}>
          {RESOURCE_KINDS.map((k) => (
            <option key={k} value={k}>
              {RESOURCE_KIND_LABELS[k]}
            </option>
          ))}
        </select>
      </label>
      <label className={label}>
        Name
        <input name="name" maxLength={80} className={inputClass} placeholder="e.g. Bay 3" />
      </label>
      {kind === "mechanic" && (
        <label className={`${label} md:col-span-2`}>
          Which mechanic (optional)
          <select name="userId" defaultValue="" className={inputClass}>
            <option value="">Not named</option>
            {mechanics.map((m) => (
              <option key={m.id} value={m.id}>
                {m.name}
              </option>
            ))}
          </select>
        </label>
      )}
      <button type="submit" disabled={s.busy} className={`${buttonClass} md:col-span-2 md:justify-self-start`}>
        Add resource
      </button>
      <Outcome error={s.error} ok={s.ok} testId="add-resource" />
    </form>
  );
}

export function RetireResource({ resourceId, name }: { resourceId: string; name: string }) {
  return (
    <ReasonAction
      url={`/api/office/resources/${resourceId}/retire`}
      openText="Retire…"
      openLabel={`Retire ${name}…`}
      question={`Why retire ${name}?`}
      submitText="Retire it"
      done={`${name} retired.`}
      testId="retire"
    />
  );
}
