"use client";

import { createContext, useContext } from "react";
import type { BenchDb } from "@/lib/client/bench-db";
import type { Author } from "@/lib/client/bench-store";
import type { Role } from "@/lib/auth/roles";

export interface BenchUser {
  id: string;
  name: string;
  role: Role;
  torqueUnit: "N·m" | "lbf·ft";
}

export interface BenchContextValue {
  user: BenchUser;
  db: BenchDb;
  /** Who records on this tablet: the signed-in user and this browser's device id. */
  author: Author;
  /** Push and pull now (no-op while offline); one run at a time, a call during a run asks for one more after it. */
  syncNow: () => void;
}

export const BenchContext = createContext<BenchContextValue | null>(null);

export function useBench(): BenchContextValue {
  const ctx = useContext(BenchContext);
  if (!ctx) throw new Error("useBench outside the bench");
  return ctx;
}

/** The author and device id every piece of bench work is recorded with. */
export function useAuthor(): Author {
  return useBench().author;
}
