"use client";

import { createContext, useContext } from "react";
import type { BenchDb } from "@/lib/client/bench-db";
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
  deviceId: string;
  /** Push and pull now (no-op while offline); resolves when done. */
  syncNow: () => void;
}

export const BenchContext = createContext<BenchContextValue | null>(null);

export function useBench(): BenchContextValue {
  const ctx = useContext(BenchContext);
  if (!ctx) throw new Error("useBench outside the bench");
  return ctx;
}
