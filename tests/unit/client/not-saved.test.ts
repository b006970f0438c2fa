// fake-indexeddb before dexie: dexie takes the IndexedDB it finds when it loads.
import "fake-indexeddb/auto";
import { afterEach, describe, expect, it, vi } from "vitest";
import { recordOperation } from "@/lib/client/bench-store";
import { isStoreFailure } from "@/lib/client/not-saved";
import { notSavedText as notSavedMessage } from "@/lib/client/not-saved-words";
import { author, bolt, freshDb } from "../support/tablet-db";
import { ids } from "../support/job-snapshot";

// A save the tablet's store refuses is said in workshop words (lib/client/not-saved*.ts), from the
// error dexie really rejects with, not from a hand-made one.

afterEach(() => vi.restoreAllMocks());

describe("work the tablet could not save", () => {
  it("a full store: says the storage is full and what to do, and nothing is half written", async () => {
    const db = freshDb();
    await bolt(db, 1, 1);
    // The browser refuses the write for its quota, as IndexedDB does on a full disk.
    vi.spyOn(IDBObjectStore.prototype, "add").mockImplementation(() => {
      throw new DOMException("The quota has been exceeded.", "QuotaExceededError");
    });
    const failure = await bolt(db, 1, 2).then(
      () => null,
      (e: unknown) => e,
    );
    expect(failure).not.toBeNull();
    expect(isStoreFailure(failure)).toBe(true);
    const said = notSavedMessage(failure);
    expect(said).toMatch(/^Not saved: this tablet's storage is full/);
    expect(said).not.toMatch(/quota|exceeded|DOMException/i);
    vi.restoreAllMocks();
    expect(await db.outbox.count()).toBe(1);
  });

  it("a store closed under it (an update, another tab): says to reload", async () => {
    const db = freshDb();
    await bolt(db, 1, 1);
    db.close();
    const failure = await bolt(db, 1, 2).then(
      () => null,
      (e: unknown) => e,
    );
    expect(isStoreFailure(failure)).toBe(true);
    expect(notSavedMessage(failure)).toMatch(/^Not saved: the bench's store on this tablet was closed.*Reload the bench/);
  });

  it("an entry its own checks refuse: says the check's words, not zod's", async () => {
    const db = freshDb();
    const failure = await recordOperation(db, author, ids.job, "torque.bolt-confirmed", {
      stepId: ids.stepBolts,
      torqueSpecId: ids.rodSpec,
      passIndex: 1,
      bolt: 0,
    }).then(
      () => null,
      (e: unknown) => e,
    );
    expect(isStoreFailure(failure)).toBe(false);
    const said = notSavedMessage(failure);
    expect(said).toMatch(/^Not saved: /);
    expect(said).not.toMatch(/expected|received|Too small/);
  });

  it("a network error is not taken for a store failure", () => {
    expect(isStoreFailure(new TypeError("Failed to fetch"))).toBe(false);
  });
});
