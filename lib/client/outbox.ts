/**
 * Recording work on the tablet: each action becomes an operation with a device-made UUID, the
 * author, the device time and a hybrid-logical-clock stamp, appended to the outbox in one
 * IndexedDB transaction with the clock, so a crash can never reuse a stamp.
 */
import { createClock, tick, type HlcState } from "@/lib/sync/hlc";
import { operationSchema, type Operation, type OperationKind } from "@/lib/sync/operations";
import { getMeta, META, setMeta, type BenchDb } from "./bench-db";

type PayloadOf<K extends OperationKind> = Extract<Operation, { kind: K }>["payload"];

export interface Author {
  userId: string;
  deviceId: string;
}

export async function recordOperation<K extends OperationKind>(
  db: BenchDb,
  author: Author,
  workOrderId: string,
  kind: K,
  payload: PayloadOf<K>,
  now = Date.now(),
): Promise<Operation> {
  return db.transaction("rw", db.meta, db.outbox, async () => {
    const clock = await getMeta<HlcState>(db, META.clock, createClock(author.deviceId));
    const base = clock.deviceId === author.deviceId ? clock : createClock(author.deviceId);
    const { state, stamp } = tick(base, now);
    // Validate with the same schema the server uses: a bad entry is caught here, not at sync time.
    const op = operationSchema.parse({
      id: crypto.randomUUID(),
      kind,
      workOrderId,
      authorId: author.userId,
      deviceId: author.deviceId,
      deviceTime: new Date(now).toISOString(),
      stamp,
      payload,
    });
    await setMeta(db, META.clock, state);
    await db.outbox.add({ id: op.id, workOrderId, stamp, op, state: "waiting", createdAt: now });
    return op;
  });
}

/** Operations still waiting for the server, in stamp order. */
export async function waitingOperations(db: BenchDb): Promise<Operation[]> {
  const rows = await db.outbox.where("state").equals("waiting").sortBy("stamp");
  return rows.map((r) => r.op);
}
