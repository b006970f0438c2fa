import { randomUUID } from "node:crypto";
import type { Kysely } from "kysely";
import { formatStamp } from "@/lib/sync/hlc";
import type { Operation, OperationKind, OperationOf } from "@/lib/sync/operations";
import type { Database } from "../schema";
import { mergeBatch } from "../sync/merge";

// Demo bench work written as a tablet would have sent it: operations 40 s apart from `start`,
// merged through the sync as the mechanic.
export function demoTablet(workOrderId: string, authorId: string, deviceId: string, start: number) {
  const ops: Operation[] = [];
  const make = <K extends OperationKind>(kind: K, payload: OperationOf<K>["payload"]) => {
    const at = start + ops.length * 40_000;
    ops.push({
      id: randomUUID(),
      kind,
      workOrderId,
      authorId,
      deviceId,
      deviceTime: new Date(at).toISOString(),
      stamp: formatStamp({ wallMs: at, counter: 0, deviceId }),
      payload,
    } as Operation);
  };
  return { ops, make, start };
}

/** Merges the demo tablet's operations as `mechanic`, at the time of the last one. */
export async function sendDemoWork(
  db: Kysely<Database>,
  shopId: string,
  mechanic: { id: string; name: string; email: string },
  tablet: ReturnType<typeof demoTablet>,
  deviceId: string,
) {
  await mergeBatch(
    db,
    { id: mechanic.id, shopId, role: "mechanic", name: mechanic.name, email: mechanic.email, customerId: null },
    { deviceId, cursor: null, operations: tablet.ops },
    { nowMs: tablet.start + tablet.ops.length * 40_000 },
  );
}
