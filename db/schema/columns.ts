import type { ColumnType } from "kysely";

// Column types shared by the table types. numeric columns come back from pg as strings, so a
// reading or a figure is never silently rounded on the way out.
export type Timestamp = ColumnType<Date, Date | string, Date | string>;
/** A timestamp the database fills in (DEFAULT now()) unless one is given. */
export type DefaultTimestamp = ColumnType<Date, Date | string | undefined, Date | string>;
export type Numeric = ColumnType<string, string | number, string | number>;
export type Json<T = unknown> = ColumnType<T, string, string>;
/** A date without a time (PostgreSQL date), kept as its ISO text. */
export type DateOnly = ColumnType<string, string, string>;
