import { NextResponse } from "next/server";
import { parseWorkOrderId } from "@/app/_server/route-params";
import { requireApiArea } from "@/app/_server/session";
import { db } from "@/db/setup/client";
import { listDynoRuns } from "@/db/records/dyno";
import { importDynoRun } from "@/db/records/dyno-import";

type Params = { params: Promise<{ id: string }> };

const notFound = () => NextResponse.json({ error: "No such work order in your shop." }, { status: 404 });

// The work order's runs (as recorded; the page computes the curves).
export async function GET(_req: Request, { params }: Params) {
  const auth = await requireApiArea("dyno");
  if (auth.response) return auth.response;
  const id = parseWorkOrderId((await params).id);
  if (!id) return notFound();
  return NextResponse.json({ runs: await listDynoRuns(db(), auth.user.shopId, id) });
}

// A new run: fields plus its curve (table rows or CSV text). All checked; stored all or nothing.
export async function POST(req: Request, { params }: Params) {
  const auth = await requireApiArea("dyno");
  if (auth.response) return auth.response;
  const id = parseWorkOrderId((await params).id);
  if (!id) return notFound();
  let body: unknown;
  try {
    body = await req.json();
  } catch {
    return NextResponse.json({ error: "The request body must be JSON.", fieldErrors: {}, curveErrors: [] }, { status: 400 });
  }
  const r = await importDynoRun(db(), auth.user.shopId, id, auth.user.id, body);
  if (r.ok) return NextResponse.json({ id: r.id }, { status: 201 });
  if (r.status === 404) return notFound();
  return NextResponse.json({ error: "Some entries need fixing.", fieldErrors: r.fieldErrors, curveErrors: r.curveErrors }, { status: 400 });
}
