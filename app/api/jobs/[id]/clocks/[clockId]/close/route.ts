import { created, idParam, json, route } from "@/app/_server/route";
import { closeForgottenClock, hoursOfJob } from "@/db/bench/clocks";
import { clockCloseSchema } from "@/lib/clock/close";
import { Refusal } from "@/lib/errors";

// A supervisor closes a clock left running: body { endedAt, reason }. 201 with the job's hours
// after it · 403 not a supervisor · 404 no such clock on this job · 409 the clock already ended,
// or the end is before its clock-on or in the future (the reason says which).
export const POST = route(
  {
    access: { area: "review" },
    params: ["id", "clockId"],
    body: json(clockCloseSchema, { labels: { endedAt: "Ended at", reason: "Reason" } }),
  },
  async ({ user, params, body, db }) => {
    if (user.role !== "supervisor") throw new Refusal("Only a supervisor may close a clock left running.", 403);
    const jobId = idParam(params.id, "No such work order in this shop.");
    const clockId = idParam(params.clockId, "No such clock in this shop.");
    const hours = await hoursOfJob(db, user.shopId, jobId);
    if (!hours?.spans.some((s) => s.id === clockId)) throw new Refusal("No such clock on this work order.", 404);
    await closeForgottenClock(db, user, clockId, body);
    return created(await hoursOfJob(db, user.shopId, jobId));
  },
);
