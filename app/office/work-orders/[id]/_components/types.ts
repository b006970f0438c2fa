import type { ReplyOf } from "@/app/_server/route";
import type { GET } from "@/app/api/office/work-orders/[id]/route";
import type { Wire } from "@/app/ui/api-client";

// What GET /api/office/work-orders/[id] answers, taken from the route (dates arrive as ISO strings).
export type WorkOrderData = Wire<ReplyOf<typeof GET>>;
export type Quote = WorkOrderData["quotes"][number];
