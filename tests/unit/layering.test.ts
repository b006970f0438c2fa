import { existsSync, readdirSync, readFileSync, statSync } from "node:fs";
import path from "node:path";
import { describe, expect, it } from "vitest";

// What may import what (DEVELOPERS.md "Layers"), checked by reading every import of lib/, db/,
// app/ and sw/. A type-only import (`import type`, or every name marked `type`) is erased when
// the code is built, so it may cross a line a value import may not: a page takes the type of
// what a route answers from the route, or from the db function that produces it.

const root = path.resolve(import.meta.dirname, "../..");

interface Import {
  from: string; // the importing file, repo-relative
  spec: string; // as written
  target: string | null; // repo-relative file it resolves to, or null for a package
  typeOnly: boolean;
}

function files(dir: string): string[] {
  if (!existsSync(path.join(root, dir))) return [];
  return readdirSync(path.join(root, dir)).flatMap((name) => {
    const rel = `${dir}/${name}`;
    if (statSync(path.join(root, rel)).isDirectory()) return files(rel);
    return /\.(ts|tsx)$/.test(name) && !name.endsWith(".d.ts") ? [rel] : [];
  });
}

function resolve(fromFile: string, spec: string): string | null {
  let base: string;
  if (spec.startsWith("@/")) base = spec.slice(2);
  else if (spec.startsWith(".")) base = path.posix.normalize(path.posix.join(path.posix.dirname(fromFile), spec));
  else return null;
  for (const ext of ["", ".ts", ".tsx", "/index.ts", "/index.tsx"]) {
    const candidate = base + ext;
    if (existsSync(path.join(root, candidate)) && statSync(path.join(root, candidate)).isFile()) return candidate;
  }
  return base;
}

const IMPORT =
  /(?:^|\n)\s*(import|export)\s+(type\s+)?([^"';]*?)\s*from\s*["']([^"']+)["']|(?:^|\n)\s*import\s+["']([^"']+)["']|import\(\s*["']([^"']+)["']\s*\)/g;

function importsOf(file: string): Import[] {
  const code = readFileSync(path.join(root, file), "utf8");
  const out: Import[] = [];
  for (const m of code.matchAll(IMPORT)) {
    const spec = m[4] ?? m[5] ?? m[6];
    let typeOnly = !!m[2];
    if (!typeOnly && m[3]) {
      const names = /\{([^}]*)\}/.exec(m[3])?.[1];
      const bare = m[3]
        .replace(/\{[^}]*\}/, "")
        .replace(/,/g, "")
        .trim();
      if (names && !bare)
        typeOnly = names
          .split(",")
          .map((n) => n.trim())
          .filter(Boolean)
          .every((n) => n.startsWith("type "));
    }
    out.push({ from: file, spec, target: resolve(file, spec), typeOnly });
  }
  return out;
}

const isClientComponent = (file: string) => /^\s*["']use client["']/.test(readFileSync(path.join(root, file), "utf8"));
const all = [...files("lib"), ...files("db"), ...files("app"), ...files("sw")];
const imports = all.flatMap(importsOf);
const under = (dir: string) => (i: Import) => i.from.startsWith(`${dir}/`);
const into = (i: Import, dir: string) => i.target !== null && i.target.startsWith(`${dir}/`);
const pkg = (i: Import, ...names: string[]) => i.target === null && names.some((n) => i.spec === n || i.spec.startsWith(`${n}/`));
const show = (list: Import[]) => list.map((i) => `${i.from} → ${i.spec}${i.typeOnly ? " (type)" : ""}`);

describe("layering: what may import what", () => {
  it("reads the imports of every file", () => {
    expect(all.length).toBeGreaterThan(200);
    expect(imports.length).toBeGreaterThan(1000);
  });

  it("lib/ is pure: nothing from app/ or db/, no React, Next, database or server-only packages (lib/client/ may use the browser's store)", () => {
    const bad = imports
      .filter(under("lib"))
      .filter(
        (i) =>
          into(i, "app") ||
          into(i, "db") ||
          pkg(i, "react", "react-dom", "next", "next-auth", "kysely", "pg", "server-only", "nodemailer", "@aws-sdk", "stripe", "pdfkit"),
      );
    expect(show(bad)).toEqual([]);
    const browserOnly = imports.filter(under("lib")).filter((i) => !i.from.startsWith("lib/client/") && pkg(i, "dexie"));
    expect(show(browserOnly)).toEqual([]);
  });

  it("db/ never imports app/, React or Next", () => {
    const bad = imports.filter(under("db")).filter((i) => into(i, "app") || pkg(i, "react", "react-dom", "next", "next-auth"));
    expect(show(bad)).toEqual([]);
  });

  it("app/ holds no SQL: it never imports kysely or pg (queries live in db/)", () => {
    const bad = imports.filter(under("app")).filter((i) => pkg(i, "kysely", "pg"));
    expect(show(bad)).toEqual([]);
  });

  it("client components and app/ui take nothing but types from db/, app/_server or route handlers", () => {
    const clientSide = (i: Import) => i.from.startsWith("app/ui/") || isClientComponent(i.from);
    const bad = imports
      .filter(under("app"))
      .filter(clientSide)
      .filter(
        (i) => !i.typeOnly && (into(i, "db") || into(i, "app/_server") || (i.target ?? "").startsWith("app/api/") || pkg(i, "server-only")),
      );
    expect(show(bad)).toEqual([]);
  });

  it("only server code imports db/: pages, layouts, route handlers and app/_server", () => {
    const serverFile = (f: string) => /\/(page|layout|route)\.tsx?$/.test(f) || f.startsWith("app/_server/") || f.startsWith("app/api/");
    const bad = imports.filter(under("app")).filter((i) => into(i, "db") && !i.typeOnly && !serverFile(i.from));
    expect(show(bad)).toEqual([]);
  });

  it("the service worker uses lib/ only", () => {
    const bad = imports.filter(under("sw")).filter((i) => into(i, "app") || into(i, "db"));
    expect(show(bad)).toEqual([]);
  });

  it('server modules say so: db/ query modules and app/_server start with import "server-only"', () => {
    const queryDirs = ["db/audit", "db/bench", "db/office", "db/records", "db/review", "db/shop", "db/sync", "db/templates", "app/_server"];
    const unmarked = all
      .filter((f) => queryDirs.some((d) => f.startsWith(`${d}/`)))
      .filter((f) => !/^import "server-only";/.test(readFileSync(path.join(root, f), "utf8")));
    expect(unmarked).toEqual([]);
  });
});
