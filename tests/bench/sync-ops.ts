import { randomUUID } from "node:crypto";
import type { Kysely } from "kysely";
import type { Database } from "@/db/schema";
import { createClock, tick, type HlcState } from "@/lib/sync/hlc";
import type { Operation, OperationKind, OperationOf, SyncBatch } from "@/lib/sync/operations";
import { canonicalDecimal, decimalOfNumber } from "@/lib/sync/reading-value";

// Test and benchmark helpers: a simulated tablet that makes operations the way the client does
// (own device id, own clock), and the spec ids of the fixture job's demo procedures.

export interface FixtureSpecs {
  jobProcedureIds: string[];
  boreStepId: string;
  boreSpecId: string;
  /** Reading labels of the bore spec (6 in the demo template). */
  boreReadings: number;
  ptwStepId: string;
  ptwSpecIds: string[];
  rodStepId: string;
  rodSpecId: string;
  caseBoltsStepId: string;
  caseBoltsSpecId: string;
  /** The step whose cure timer holds the oil fill (the case bolts: the cure starts once they are torqued). */
  cureStepId: string;
  cureTimerSpecId: string;
  /** The step the cure holds. */
  oilPrimeStepId: string;
  measureStage: { jobProcedureId: string; stageKey: string };
}

/** Spec ids of the fixture job (demo bottom-end procedure pinned first). */
export async function fixtureSpecs(
  db: Kysely<Database>,
  fx: { procedures: { id: string; templateVersionId: string }[]; stepByKey: Record<string, { id: string }> },
): Promise<FixtureSpecs> {
  const step = (key: string) => fx.stepByKey[key].id;
  const m = await db
    .selectFrom("measurement_specs")
    .select(["id", "key", "step_id", "reading_labels"])
    .where("step_id", "in", [step("bore-cyl-1"), step("piston-clearance")])
    .execute();
  const t = await db
    .selectFrom("torque_specs")
    .select(["id", "step_id"])
    .where("step_id", "in", [step("rod-bolts"), step("case-bolts")])
    .execute();
  const timer = await db.selectFrom("timer_specs").select(["id"]).where("step_id", "=", step("case-bolts")).executeTakeFirstOrThrow();
  const bore = m.find((x) => x.key === "bore-1")!;
  return {
    jobProcedureIds: fx.procedures.map((p) => p.id),
    boreStepId: step("bore-cyl-1"),
    boreSpecId: bore.id,
    boreReadings: bore.reading_labels.length,
    ptwStepId: step("piston-clearance"),
    ptwSpecIds: m.filter((x) => x.step_id === step("piston-clearance")).map((x) => x.id),
    rodStepId: step("rod-bolts"),
    rodSpecId: t.find((x) => x.step_id === step("rod-bolts"))!.id,
    caseBoltsStepId: step("case-bolts"),
    caseBoltsSpecId: t.find((x) => x.step_id === step("case-bolts"))!.id,
    cureStepId: step("case-bolts"),
    cureTimerSpecId: timer.id,
    oilPrimeStepId: step("oil-prime"),
    measureStage: { jobProcedureId: fx.procedures[0].id, stageKey: "measure" },
  };
}

/** A simulated tablet: its own device id and clock, signed in as `authorId`. */
export class Tablet {
  private clock: HlcState;
  cursor: string | null = null;

  constructor(
    readonly deviceId: string,
    readonly authorId: string,
    readonly workOrderId: string,
    private readonly nowMs: () => number = Date.now,
  ) {
    this.clock = createClock(deviceId);
  }

  make<K extends OperationKind>(kind: K, payload: OperationOf<K>["payload"], over: Partial<Operation> = {}): OperationOf<K> {
    const now = this.nowMs();
    const t = tick(this.clock, now);
    this.clock = t.state;
    return {
      id: randomUUID(),
      kind,
      workOrderId: this.workOrderId,
      authorId: this.authorId,
      deviceId: this.deviceId,
      deviceTime: new Date(now).toISOString(),
      stamp: t.stamp,
      payload,
      ...over,
    } as OperationOf<K>;
  }

  complete(stepId: string, over: Partial<Operation> = {}) {
    return this.make("step.completed", { stepId }, over);
  }

  read(
    stepId: string,
    specId: string,
    readingIndex: number,
    value: number | string,
    extra: { supersedesId?: string; note?: string; unit?: "mm" | "in" | "µm" | "cc" } = {},
  ) {
    return this.make("measurement.recorded", {
      stepId,
      specId,
      readingIndex,
      // as the wire format keeps it: the decimal text typed (a number is taken as the decimal it prints as)
      value: (typeof value === "number" ? decimalOfNumber(value) : canonicalDecimal(value))!,
      unit: extra.unit ?? "mm",
      ...(extra.note ? { note: extra.note } : {}),
      ...(extra.supersedesId ? { supersedesId: extra.supersedesId } : {}),
    });
  }

  bolt(stepId: string, torqueSpecId: string, passIndex: number, bolt: number) {
    return this.make("torque.bolt-confirmed", { stepId, torqueSpecId, passIndex, bolt });
  }

  batch(operations: Operation[], cursor: string | null = this.cursor): SyncBatch {
    return { deviceId: this.deviceId, cursor, operations };
  }
}

/** A mixed backlog like a day's bench work: readings, torque confirmations, completions. */
export function backlog(tablet: Tablet, specs: FixtureSpecs, count: number): Operation[] {
  const ops: Operation[] = [];
  for (let i = 0; ops.length < count; i++) {
    switch (i % 4) {
      case 0:
      case 1:
        ops.push(tablet.read(specs.boreStepId, specs.boreSpecId, i % specs.boreReadings, 76 + (i % 20) / 1000));
        break;
      case 2:
        ops.push(tablet.bolt(specs.caseBoltsStepId, specs.caseBoltsSpecId, 1 + (i % 3), 1 + (i % 10)));
        break;
      default:
        ops.push(tablet.complete(i % 8 === 3 ? specs.boreStepId : specs.rodStepId));
    }
  }
  return ops;
}
