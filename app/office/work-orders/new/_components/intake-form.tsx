"use client";

import { issuesOf } from "@/lib/zod-issues";
import { useRouter } from "next/navigation";
import { useState, type FormEvent } from "react";
import { intakeSchema } from "@/lib/office/schemas";
import { api, ApiError, fieldErrors } from "@/app/ui/api-client";
import { buttonClass, Field, FormMessage, inputClass } from "@/app/ui/form-field";

interface BikeOption {
  id: string;
  label: string;
}

// Booking in: which bike, what the job is, the customer's complaint or goal in their words, the
// odometer, and photos of the bike's condition as it arrived.
export function IntakeForm({ bikes, bikeId }: { bikes: BikeOption[]; bikeId?: string }) {
  const router = useRouter();
  const [errors, setErrors] = useState<Record<string, string>>({});
  const [error, setError] = useState<string | null>(null);
  const [busy, setBusy] = useState(false);

  async function onSubmit(e: FormEvent<HTMLFormElement>) {
    e.preventDefault();
    const form = new FormData(e.currentTarget);
    const parsed = intakeSchema.safeParse({
      bikeId: form.get("bikeId"),
      title: form.get("title"),
      complaint: form.get("complaint"),
      odometerKm: form.get("odometerKm"),
    });
    const photos = form.getAll("photos").filter((f) => f instanceof File && f.size > 0) as File[];
    const photoProblem =
      photos.length > 8
        ? "attach at most 8 photos"
        : photos.find((p) => !/^image\/(jpeg|png|webp)$/.test(p.type))
          ? "photos must be JPEG, PNG or WebP"
          : photos.find((p) => p.size > 10 * 1024 * 1024)
            ? "each photo must be under 10 MB"
            : null;
    if (!parsed.success || photoProblem) {
      setErrors({ ...(parsed.success ? {} : fieldErrors(issuesOf(parsed.error))), ...(photoProblem ? { photos: photoProblem } : {}) });
      setError("Check the marked fields.");
      return;
    }
    setErrors({});
    setBusy(true);
    try {
      const r = await api<{ id: string; warning?: string }>("POST", "/api/office/work-orders", form);
      router.push(`/office/work-orders/${r.id}${r.warning ? `?warning=${encodeURIComponent(r.warning)}` : ""}`);
    } catch (err) {
      if (err instanceof ApiError) setErrors(fieldErrors(err.issues));
      setError((err as Error).message);
      setBusy(false);
    }
  }

  return (
    <form onSubmit={onSubmit} noValidate className="mt-6 grid max-w-3xl gap-5" data-testid="intake-form">
      <Field label="Bike" name="bikeId" error={errors.bikeId}>
        <select id="bikeId" name="bikeId" defaultValue={bikeId ?? ""} className={inputClass} aria-invalid={Boolean(errors.bikeId)}>
          <option value="">Choose the bike…</option>
          {bikes.map((b) => (
            <option key={b.id} value={b.id}>
              {b.label}
            </option>
          ))}
        </select>
      </Field>
      <Field label="Job in a few words" name="title" error={errors.title}>
        <input id="title" name="title" className={inputClass} aria-invalid={Boolean(errors.title)} />
      </Field>
      <Field label="Customer's complaint or goal" name="complaint" error={errors.complaint} hint="In the customer's own words">
        <textarea id="complaint" name="complaint" rows={4} className={`${inputClass} py-2`} aria-invalid={Boolean(errors.complaint)} />
      </Field>
      <Field label="Odometer (km)" name="odometerKm" error={errors.odometerKm}>
        <input
          id="odometerKm"
          name="odometerKm"
          inputMode="numeric"
          className={`${inputClass} w-48 font-mono`}
          aria-invalid={Boolean(errors.odometerKm)}
        />
      </Field>
      <Field
        label="Condition photos"
        name="photos"
        error={errors.photos}
        hint="Up to 8 photos: scratches, leaks, damage as the bike arrived"
      >
        <input id="photos" name="photos" type="file" accept="image/jpeg,image/png,image/webp" multiple className="text-lg" />
      </Field>
      <FormMessage error={error} />
      <div>
        <button type="submit" disabled={busy} className={buttonClass}>
          {busy ? "Booking in…" : "Book in"}
        </button>
      </div>
    </form>
  );
}
