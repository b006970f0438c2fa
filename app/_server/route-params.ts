import { z } from "zod";

// Route parameters are checked like any other input: a malformed id is "not found", never a 500.
export const workOrderIdSchema = z.uuid();

export function parseWorkOrderId(value: unknown): string | null {
  const r = workOrderIdSchema.safeParse(value);
  return r.success ? r.data : null;
}
