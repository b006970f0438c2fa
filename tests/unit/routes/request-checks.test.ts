import { afterEach, describe, expect, it } from "vitest";
import { readLimited } from "@/app/_server/request-body";
import { isSameOrigin } from "@/app/_server/same-origin";
import { isDatabaseFailure } from "@/db/setup/failures";
import { Refusal } from "@/lib/errors";

const post = (headers: Record<string, string>, url = "http://localhost:3000/api/x") => new Request(url, { method: "POST", headers });

describe("same-origin check", () => {
  const saved = process.env.NEXTAUTH_URL;
  afterEach(() => {
    if (saved === undefined) delete process.env.NEXTAUTH_URL;
    else process.env.NEXTAUTH_URL = saved;
  });

  it("passes our own origin, by the request's URL, its Host header or NEXTAUTH_URL", () => {
    delete process.env.NEXTAUTH_URL;
    expect(isSameOrigin(post({ origin: "http://localhost:3000" }))).toBe(true);
    expect(isSameOrigin(post({ origin: "http://bench.local:8080", host: "bench.local:8080" }, "http://0.0.0.0:3000/api/x"))).toBe(true);
    process.env.NEXTAUTH_URL = "https://workshop.example/";
    expect(isSameOrigin(post({ origin: "https://workshop.example" }, "http://10.0.0.5:3000/api/x"))).toBe(true);
  });

  it("passes Sec-Fetch-Site: same-origin without an Origin", () => {
    expect(isSameOrigin(post({ "sec-fetch-site": "same-origin" }))).toBe(true);
  });

  it("refuses another origin, a null origin, a cross-site fetch and a request with neither header", () => {
    delete process.env.NEXTAUTH_URL;
    expect(isSameOrigin(post({ origin: "https://elsewhere.example" }))).toBe(false);
    expect(isSameOrigin(post({ origin: "null" }))).toBe(false);
    expect(isSameOrigin(post({ "sec-fetch-site": "same-site" }))).toBe(false);
    expect(isSameOrigin(post({ "sec-fetch-site": "cross-site", origin: "http://localhost:3001" }))).toBe(false);
    expect(isSameOrigin(post({}))).toBe(false);
  });
});

describe("reading a body within its limit", () => {
  const streamed = (bytes: number, chunk = 1000) =>
    new Request("http://x/", {
      method: "POST",
      body: new ReadableStream<Uint8Array>({
        start(c) {
          for (let at = 0; at < bytes; at += chunk) c.enqueue(new Uint8Array(Math.min(chunk, bytes - at)));
          c.close();
        },
      }),
      duplex: "half",
    } as RequestInit);

  it("reads a body up to the limit", async () => {
    expect((await readLimited(streamed(5000), { maxBytes: 5000 })).byteLength).toBe(5000);
  });

  it("refuses a declared length over the limit before reading", async () => {
    const req = new Request("http://x/", { method: "POST", headers: { "content-length": "5001" }, body: "x" });
    await expect(readLimited(req, { maxBytes: 5000, tooLargeHint: "Send less." })).rejects.toMatchObject({
      status: 413,
      message: "The body is 5001 bytes; the limit is 5000 bytes. Send less.",
    });
  });

  it("stops a streamed body as soon as it passes the limit, whatever the headers say", async () => {
    const e = await readLimited(streamed(50_000), { maxBytes: 5000 }).catch((x: unknown) => x);
    expect(e).toBeInstanceOf(Refusal);
    expect(e).toMatchObject({ status: 413, message: "The body is over 5000 bytes, the limit." });
  });
});

describe("which errors are the database failing", () => {
  it("counts lost connections, shutdowns, exhausted resources and lost transaction races", () => {
    const coded = (code: string) => Object.assign(new Error("x"), { code });
    for (const e of [
      coded("ECONNREFUSED"),
      coded("57P01"),
      coded("08006"),
      coded("53300"),
      coded("40001"),
      coded("40P01"),
      new Error("Connection terminated unexpectedly"),
      new Error("timeout exceeded when trying to connect"),
    ]) {
      expect(isDatabaseFailure(e), String((e as { code?: string }).code ?? e.message)).toBe(true);
    }
    expect(isDatabaseFailure(new AggregateError([coded("ECONNREFUSED")], "connect"))).toBe(true);
    expect(isDatabaseFailure(new Error("wrapped", { cause: coded("ETIMEDOUT") }))).toBe(true);
  });

  it("does not count our own mistakes: constraint and data errors, refusals, plain bugs", () => {
    const coded = (code: string) => Object.assign(new Error("x"), { code });
    for (const e of [
      coded("23505"),
      coded("22P02"),
      coded("42P01"),
      new Refusal("no"),
      new TypeError("undefined is not a function"),
      null,
      "text",
    ]) {
      expect(isDatabaseFailure(e)).toBe(false);
    }
  });
});
