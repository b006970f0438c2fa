import type { Selectable } from "kysely";
import type { AftercareTables } from "./aftercare";
import type { AuditTables } from "./audit";
import type { BenchTables } from "./bench";
import type { CalendarTables } from "./calendar";
import type { ClockTables } from "./clocks";
import type { CustomerContactTables } from "./customer-contact";
import type { DynoTables } from "./dyno";
import type { ExtraWorkTables } from "./extra-work";
import type { MailTables } from "./mail";
import type { OfficeTables } from "./office";
import type { ReviewTables } from "./review";
import type { SessionTables } from "./sessions";
import type { StockTables } from "./stock";
import type { ShopTables, UsersTable } from "./shop";
import type { SyncTables } from "./sync";
import type { TemplateTables } from "./templates";
import type { WorkOrderTables } from "./work-orders";

// The whole database as Kysely sees it: one file per subject in this folder.
export interface Database
  extends
    ShopTables,
    TemplateTables,
    WorkOrderTables,
    BenchTables,
    ReviewTables,
    OfficeTables,
    DynoTables,
    AuditTables,
    SessionTables,
    SyncTables,
    MailTables,
    AftercareTables,
    CalendarTables,
    ClockTables,
    StockTables,
    CustomerContactTables,
    ExtraWorkTables {}

export type User = Selectable<UsersTable>;
