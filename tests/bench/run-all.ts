// Every benchmark in one go (`npm run bench`). Each prints its own table of figures; nothing here
// passes or fails on a number.
import { print as printAuditLog, run as auditLog } from "./audit-log";
import { print as printPaint, run as paint } from "./bench-paint";
import { print as printPrecache, run as precache } from "./bench-precache";
import { print as printReviewYear, run as reviewYear } from "./review-year";
import { run as calcBuildSheet } from "./calc-build-sheet";
import { print as printStockWeek, run as stockWeek } from "./stock-week";
import { print as printSnapshotDelta, run as snapshotDelta } from "./snapshot-delta";
import { print as printSyncMerge, run as syncMerge } from "./sync-merge";

console.log("== lib/calc: a full build sheet");
calcBuildSheet();
console.log("\n== sync merge into PostgreSQL");
printSyncMerge(await syncMerge());
console.log("\n== audit log: page and CSV on a large log vs the demo's");
printAuditLog(await auditLog());
console.log("\n== a busy year: the week plan and the stock's batch search vs a small shop");
printStockWeek(await stockWeek());
console.log("\n== review queue, its count, the out-of-tolerance filter and the audit log on a year of work vs a demo-sized shop");
printReviewYear(await reviewYear());
console.log("\n== a job's copy per sync: whole vs only what changed");
printSnapshotDelta(await snapshotDelta());
console.log("\n== the bench's service worker precache and first load (from the last build)");
printPrecache(precache());
console.log(
  "\n== the bench's first paint in Chromium: first load, reopened offline, keypad taps (the running app, or the last build served for it)",
);
printPaint(await paint());
process.exit(0);
