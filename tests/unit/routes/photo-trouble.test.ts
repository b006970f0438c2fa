import { describe, expect, it, vi } from "vitest";
import { photoStoreTrouble } from "@/app/_server/photo-trouble";
import { Refusal } from "@/lib/errors";

// What the office is told when photos could not be stored after the work order or note was saved.
describe("the photo store's trouble, in words", () => {
  it("passes on a refusal's own reason, and never the store's or the database's own text", () => {
    const log = vi.spyOn(console, "error").mockImplementation(() => undefined);
    expect(photoStoreTrouble(new Refusal("A photo is at most 12 MiB.", 413))).toBe("A photo is at most 12 MiB.");
    const said = photoStoreTrouble(new Error("connect ECONNREFUSED 10.0.3.7:9000"));
    expect(said).toBe("the photo store did not answer");
    expect(said).not.toMatch(/ECONNREFUSED|10\.0\.3\.7/);
    expect(log).toHaveBeenCalledTimes(1);
    log.mockRestore();
  });
});
