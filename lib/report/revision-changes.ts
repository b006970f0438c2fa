/**
 * What changed between two stored copies of a build report, from the lines each printed (one per
 * table row or sentence, prefixed with its section: app/_server/report/report-rows.ts). A line
 * gone and a line come that name the same thing (the same section and first cell, e.g. the same
 * stage or reading) make one "changed" entry; the rest are "added" or "no longer". Lines that
 * repeat are counted, so a second identical row is a change too. Pure.
 */

/** The part of a line that names what it is about: its section and first cell. */
function subjectOf(line: string): string {
  const cut = line.indexOf(" · ");
  return cut === -1 ? line : line.slice(0, cut);
}

function countLines(lines: readonly string[]): Map<string, number> {
  const m = new Map<string, number>();
  for (const l of lines) m.set(l, (m.get(l) ?? 0) + 1);
  return m;
}

/** Lines of `a` not matched in `b` (as many times as they are missing), in `a`'s order. */
function missingFrom(a: readonly string[], b: readonly string[]): string[] {
  const left = countLines(b);
  const out: string[] = [];
  for (const l of a) {
    const n = left.get(l) ?? 0;
    if (n > 0) left.set(l, n - 1);
    else out.push(l);
  }
  return out;
}

export function revisionChanges(before: readonly string[], after: readonly string[]): string[] {
  const gone = missingFrom(before, after);
  const come = missingFrom(after, before);
  const out: string[] = [];
  const paired = new Set<number>();
  for (const g of gone) {
    const subject = subjectOf(g);
    const i = come.findIndex((c, k) => !paired.has(k) && subjectOf(c) === subject && subject !== g);
    if (i === -1) {
      out.push(`No longer: ${g}`);
      continue;
    }
    paired.add(i);
    out.push(`Changed: ${subject}: ${g.slice(subject.length + 3)} → ${come[i].slice(subject.length + 3)}`);
  }
  come.forEach((c, k) => {
    if (!paired.has(k)) out.push(`Added: ${c}`);
  });
  return out;
}
