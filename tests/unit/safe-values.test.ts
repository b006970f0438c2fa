import fc from "fast-check";
import { describe, expect, it } from "vitest";
import {
  finiteNumber,
  hasLoneSurrogate,
  safeText,
  saneInstant,
  storableContentType,
  storableFileName,
  unstorableTexts,
} from "@/lib/safe-values";
import { fieldLabel } from "@/lib/zod-issues";
import { readTemplateFile } from "@/lib/procedures/template-file";
import { operationSchema } from "@/lib/sync/operations";

// Inputs PostgreSQL refuses (NUL in text: "invalid byte sequence for encoding UTF8: 0x00"; a lone
// surrogate cannot be encoded as UTF-8; timestamptz and Date refuse year 0000 / 275760) must be
// refused at the edge, per field, in workshop words.
const note = safeText({ label: "Note", max: 20, multiline: true });
const oneLine = safeText({ label: "Batch number", min: 1, max: 20 });
const messages = (r: { success: boolean; error?: { issues: { message: string }[] } }) => r.error?.issues.map((i) => i.message) ?? [];

describe("safe text", () => {
  it("refuses NUL, lone surrogates and control characters, naming the field", () => {
    expect(messages(note.safeParse("torque\u0000ok"))).toEqual(["Note holds a NUL character, which cannot be stored: retype it."]);
    expect(messages(note.safeParse("ok \uD83D here"))[0]).toMatch(/^Note holds a broken character/);
    expect(messages(note.safeParse("\uDC00"))[0]).toMatch(/broken character/);
    expect(messages(note.safeParse("bell\u0007"))[0]).toMatch(/control character/);
  });

  it("keeps real emoji, accents and, where allowed, line breaks", () => {
    expect(note.parse(" gap 0.030 ✓ 🔧 ")).toBe("gap 0.030 ✓ 🔧");
    expect(note.parse("line one\nline two")).toBe("line one\nline two");
    expect(messages(oneLine.safeParse("B-1\nB-2"))).toEqual(["Batch number must be on one line (no line breaks or tabs)."]);
  });

  it("says the limits in words", () => {
    expect(messages(oneLine.safeParse("   "))).toEqual(["Enter the batch number."]);
    expect(messages(note.safeParse("x".repeat(21)))).toEqual(["Note: at most 20 characters."]);
    expect(messages(note.safeParse(42))).toEqual(["Note must be text."]);
  });

  it("anything it accepts encodes to UTF-8 and back unchanged, and holds no NUL (property)", () => {
    fc.assert(
      fc.property(fc.string({ unit: "binary", maxLength: 20 }), (s) => {
        const r = note.safeParse(s);
        if (!r.success) return;
        expect(r.data.includes("\u0000")).toBe(false);
        expect(hasLoneSurrogate(r.data)).toBe(false);
        expect(new TextDecoder().decode(new TextEncoder().encode(r.data))).toBe(r.data);
      }),
    );
  });
});

describe("sane instants", () => {
  const at = saneInstant("Tablet time");
  it("accepts a real time with a zone and keeps the string", () => {
    expect(at.parse("2026-12-02T09:30:00.000Z")).toBe("2026-12-02T09:30:00.000Z");
    expect(at.parse("2026-12-02T10:30:00+01:00")).toBe("2026-12-02T10:30:00+01:00");
  });
  it("refuses year 0000, far futures and times without a zone", () => {
    expect(messages(at.safeParse("0000-01-01T00:00:00.000Z"))).toEqual([
      "Tablet time must be between the years 2000 and 2099; the tablet's clock may be wrong.",
    ]);
    expect(messages(at.safeParse("2199-01-01T00:00:00Z"))[0]).toMatch(/between the years 2000 and 2099/);
    expect(messages(at.safeParse("2026-12-02T09:30:00"))[0]).toMatch(/with a time zone/);
  });
});

describe("finite numbers", () => {
  const torque = finiteNumber({ label: "Wrench reading", min: 0, max: 2000, unit: "N·m" });
  it("refuses NaN, Infinity and out-of-range values with the unit", () => {
    for (const bad of [Number.NaN, Number.POSITIVE_INFINITY]) {
      expect(messages(torque.safeParse(bad))).toEqual(["Wrench reading must be a number between 0 N·m and 2000 N·m."]);
    }
    for (const bad of [-1, 1e308]) expect(messages(torque.safeParse(bad))).toEqual(["Wrench reading must be between 0 N·m and 2000 N·m."]);
    expect(torque.parse(45.5)).toBe(45.5);
  });
});

describe("the sync wire format uses them", () => {
  const base = {
    id: "5b0b8a4e-2a4b-4a8e-9a64-0d7a3b1c2d3e",
    workOrderId: "6b0b8a4e-2a4b-4a8e-9a64-0d7a3b1c2d3e",
    authorId: "7b0b8a4e-2a4b-4a8e-9a64-0d7a3b1c2d3e",
    deviceId: "tab-1",
    deviceTime: "2026-12-02T09:30:00.000Z",
    stamp: "001764667800000-000000-tab-1",
  };
  const step = "8b0b8a4e-2a4b-4a8e-9a64-0d7a3b1c2d3e";
  it("refuses a note with NUL, a caption with a lone surrogate and a year-0000 device time", () => {
    const spec = "9b0b8a4e-2a4b-4a8e-9a64-0d7a3b1c2d3e";
    const reading = { stepId: step, specId: spec, readingIndex: 0, value: 0.03, unit: "mm" };
    expect(operationSchema.safeParse({ ...base, kind: "measurement.recorded", payload: { ...reading, note: "a\u0000b" } }).success).toBe(
      false,
    );
    expect(operationSchema.safeParse({ ...base, kind: "measurement.recorded", payload: reading }).success).toBe(true);
    const photo = { attachmentId: spec, stepId: step, contentType: "image/jpeg", byteSize: 10, caption: "\uD800" };
    expect(operationSchema.safeParse({ ...base, kind: "photo.queued", payload: photo }).success).toBe(false);
    expect(
      operationSchema.safeParse({ ...base, deviceTime: "0000-01-01T00:00:00.000Z", kind: "step.completed", payload: { stepId: step } })
        .success,
    ).toBe(false);
  });
});

describe("texts a request holds that cannot be stored", () => {
  const label = (path: (string | number)[]) => `[${path.join("/")}]`;

  it("finds each one with where it is, keys included, and leaves line breaks, tabs and whole emoji alone", () => {
    const found = unstorableTexts(
      { name: "ok 🏍", notes: "line\nnext\ttab\r", lines: [{ d: "a\u0000" }, { d: "b" }], ["k\u0001"]: 1, deep: { x: ["\udc00"] } },
      label,
    );
    expect(found).toEqual([
      { path: ["lines", 0, "d"], message: "[lines/0/d] holds a NUL character, which cannot be stored: retype it." },
      { path: ["k\u0001"], message: "[k\u0001] holds a control character, which cannot be stored: retype it." },
      { path: ["deep", "x", 0], message: "[deep/x/0] holds a broken character (half of an emoji or symbol): retype it." },
    ]);
    expect(unstorableTexts({ a: 1, b: null, c: true, d: [2.5, "fine"] }, label)).toEqual([]);
  });

  it("lists at most `max`, and any text anywhere that holds a NUL is found (property)", () => {
    expect(
      unstorableTexts(
        Array.from({ length: 80 }, () => "\u0000"),
        label,
        50,
      ),
    ).toHaveLength(50);
    fc.assert(
      fc.property(fc.json(), fc.string(), fc.string(), (json, before, after) => {
        const value = { text: `${before}\u0000${after}`, data: JSON.parse(json) as unknown };
        return unstorableTexts(value, label).some((f) => f.path[0] === "text");
      }),
    );
  });

  it("a template file holding one is refused with its place in the file", () => {
    const r = readTemplateFile(
      JSON.stringify({
        format: "benchtag-template",
        formatVersion: 1,
        key: "k",
        name: "Head",
        stages: [{ key: "s", title: "T\u0000", steps: [] }],
      }),
    );
    expect(r).toEqual({
      ok: false,
      issues: [{ path: "stages[0].title", message: "Title holds a NUL character, which cannot be stored: retype it." }],
    });
  });
});

describe("a file's name and declared type as they can be stored", () => {
  it("keeps the name as written less control characters and half emoji, never cutting a character in two", () => {
    expect(storableFileName("Zylinderkopf\u0000\u0085 Übersicht ✓.png")).toBe("Zylinderkopf Übersicht ✓.png");
    expect(storableFileName("\u0000\u0001")).toBe("file");
    expect(storableFileName("a\uD83D.jpg")).toBe("a.jpg");
    expect(storableFileName(`${"🔧".repeat(150)}.jpg`, 200)).toBe("🔧".repeat(150) + ".jpg");
    expect([...storableFileName("🔧".repeat(300), 200)]).toHaveLength(200);
  });

  it("keeps a plain type/subtype and gives anything else as plain bytes", () => {
    expect(storableContentType("image/PNG")).toBe("image/png");
    expect(storableContentType("text/csv; charset=utf-8")).toBe("text/csv");
    expect(storableContentType(`application/${"x".repeat(300)}`)).toBe("application/octet-stream");
    expect(storableContentType("not a type")).toBe("application/octet-stream");
    expect(storableContentType("")).toBe("application/octet-stream");
  });
});

describe("a field's label", () => {
  it("is never an object's own property: a key named toString or constructor is 'This entry'", () => {
    expect(fieldLabel(["toString"])).toBe("This entry");
    expect(fieldLabel(["constructor"], {})).toBe("This entry");
    expect(fieldLabel(["name"], { name: "Run name" })).toBe("Run name");
  });
});
