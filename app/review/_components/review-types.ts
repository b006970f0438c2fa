// What GET /api/review/sign-offs/[id] answers (built by db/review/detail.ts).
export type { SignOffReview } from "@/db/review/detail";
export type { OutOfTolerance, ReadingLine, SpecView, StepReview, TorqueView, WithdrawnLine } from "@/lib/review/stage-review";
