// Every benchmark in one go (`npm run bench`). Each prints its own table of figures; nothing here
// passes or fails on a number.
import { run as calcBuildSheet } from "./calc-build-sheet";
import { print as printSyncMerge, run as syncMerge } from "./sync-merge";

console.log("== lib/calc: a full build sheet");
calcBuildSheet();
console.log("\n== sync merge into PostgreSQL");
printSyncMerge(await syncMerge());
process.exit(0);
