export * from "./build-sheet";
export * from "./build-figures";
export * from "./outline-text";
export * from "./figure-rows";
