import "server-only";
import { after, NextResponse } from "next/server";
import type { z } from "zod";
import { db as sharedDb, type Db } from "@/db/setup/client";
import { isDatabaseFailure } from "@/db/setup/failures";
import { loadSessionUser } from "@/db/shop/users";
import { canReach, type Area } from "@/lib/auth/roles";
import { SESSION_STATE_HEADER, type SessionState } from "@/lib/auth/session-lifetime";
import type { SessionUser } from "@/lib/auth/session-user";
import { isUuid } from "@/lib/ids";
import { CHECK_THE_FIELDS, DATABASE_NOT_ANSWERING, errorBody, Refusal, UNEXPECTED_FAILURE, type FieldIssue } from "@/lib/errors";
import { unstorableTexts } from "@/lib/safe-values";
import { fieldLabel, issuesOf, workshopErrors, type FieldLabels } from "@/lib/zod-issues";
import { readMultipart, type MultipartLimits } from "./multipart";
import { readLimited, type BodyLimit } from "./request-body";
import { isSameOrigin, NOT_FROM_OUR_PAGES } from "./same-origin";

// The one wrapper every route handler goes through (app/api/**/route.ts). In this order:
//   1. same origin, for every state-changing method (POST, PUT, PATCH, DELETE): 403 unless the
//      request comes from our own pages (./same-origin.ts) — except the signed payment webhook,
//      whose signature is its check;
//   2. who is asking: 401 not signed in, 403 the role cannot reach the route's area (lib/auth/roles);
//      the public routes name the check they make instead (`publicRoute`);
//   3. the body's content type: 415 unless it is the one the route takes (JSON, multipart form,
//      or the declared file types); a route that takes no body refuses any type but JSON;
//   4. the body's size, counted while the stream is read, before anything is buffered: 413;
//   5. the body and the query string parsed with zod: 400 (or the route's own status) with each
//      problem in workshop words (lib/zod-issues.ts);
//   6. the handler. A Refusal it throws becomes its status; a database failure anywhere (the
//      session lookup included) 503; anything else unexpected 503 too (a server error, "try again").
// Every refusal has one body: { error, issues: [{ path, message }] } (lib/errors.ts).

type RawParams = Record<string, string | string[] | undefined>;
type ParamsOf<N extends readonly string[]> = { [K in N[number]]: string };

/** The route's body: what the handler gets in `body`. */
export type BodySpec =
  | ({
      kind: "json";
      schema: z.ZodType;
      labels?: FieldLabels;
      invalid?: { status: 400 | 422; error: string };
      emptyMessage?: string;
      before?: (raw: unknown) => void;
      anyText?: boolean;
    } & BodyLimit)
  | ({ kind: "multipart" } & MultipartLimits)
  | ({ kind: "binary"; types: readonly string[] } & BodyLimit)
  | ({ kind: "text"; types: readonly string[] } & BodyLimit);

type BodyOf<B> = B extends { kind: "json"; schema: infer S extends z.ZodType }
  ? z.output<S>
  : B extends { kind: "multipart" }
    ? FormData
    : B extends { kind: "binary" }
      ? BinaryBody
      : B extends { kind: "text" }
        ? string
        : undefined;

/**
 * Raw bytes, read only when the handler asks (after its own checks, e.g. that the photo is on
 * record), and at most `maxBytes` — the route's limit or a smaller one the handler knows.
 */
export interface BinaryBody {
  type: string;
  read(maxBytes?: number): Promise<Uint8Array>;
}

export const KIB = 1024;
export const MIB = 1024 * KIB;

/** A JSON body checked with `schema` (at most `maxBytes`, 256 KiB unless given). */
export function json<S extends z.ZodType>(
  schema: S,
  opts: {
    maxBytes?: number;
    labels?: FieldLabels;
    invalid?: { status: 400 | 422; error: string };
    emptyMessage?: string;
    tooLargeHint?: string;
    before?: (raw: unknown) => void;
    /**
     * Texts are taken as sent, NUL and broken characters included: the route's schema and writer
     * make them storable themselves, item by item, so one bad entry never refuses the others (the
     * sync batch, discards, an ended session's hand-over). Every other JSON body is refused whole
     * when a text in it cannot be stored (`unstorableTextIssues`).
     */
    anyText?: boolean;
  } = {},
) {
  return { kind: "json" as const, schema, maxBytes: opts.maxBytes ?? 256 * KIB, ...opts };
}
/** A multipart form (fields and files), read as it streams within its limits (./multipart.ts). */
export function multipart(limits: MultipartLimits) {
  return { kind: "multipart" as const, ...limits };
}
/** Raw bytes of one of `types` (e.g. a photo), at most `maxBytes`, read when the handler asks. */
export function binary(types: readonly string[], maxBytes: number) {
  return { kind: "binary" as const, types, maxBytes };
}
/** The body as UTF-8 text, sent as one of `types`, at most `maxBytes`. */
export function text(types: readonly string[], maxBytes: number, opts: { tooLargeHint?: string } = {}) {
  return { kind: "text" as const, types, maxBytes, ...opts };
}

/** Who may call a route: the roles that reach an area, any of several areas, or anyone signed in. */
export type Access = { area: Area } | { anyArea: readonly Area[] } | { signedIn: true };

/**
 * The routes that no session guards, each naming the check it makes instead:
 * - "next-auth": next-auth's own sign-in endpoints (CSRF token; the credentials check is rate-limited);
 * - "payment-signature": the payment service's webhook, checked by its signature (no browser, no Origin);
 * - "ended-session": a tablet whose session the office ended hands over its unsent work; the handler
 *   checks that the signed cookie names such a session (app/api/bench/outbox-handover);
 * - "invitation-link": a customer sets their password with the token of an invitation e-mail
 *   (app/api/welcome; db/customer-contact/invitations.ts checks it);
 * - "answer-link": a customer's answers to extra work through the e-mailed one-time link, checked
 *   by the link's token (db/office/supplements.ts answerByLink).
 */
export type PublicCheck = "next-auth" | "payment-signature" | "ended-session" | "invitation-link" | "answer-link";

export interface RouteContext<P, B, Q, U> {
  req: Request;
  user: U;
  params: P;
  body: B;
  query: Q;
  db: Db;
  /** The server-side session of the request (null when a test or script handed in the user). */
  sessionId: string | null;
  /** Work to do after the answer is sent (next/server `after`; skipped when a test calls `handle`). */
  later: (work: () => Promise<unknown>) => void;
}

/** An answer with a status or headers of its own, keeping the body's type for the callers. */
export class JsonReply<T> {
  constructor(
    readonly body: T,
    readonly init: ResponseInit = {},
  ) {}
}
export const reply = <T>(body: T, init: ResponseInit = {}) => new JsonReply(body, init);
export const created = <T>(body: T) => new JsonReply(body, { status: 201 });

/** What a test (or a script) passes instead of the request's session and the shared pool. */
export interface CallOptions {
  params?: RawParams;
  /** The signed-in user as given; `undefined` to look `userId` up (or nobody). */
  user?: SessionUser | null;
  /** Look this user up in the database, as the session check does. */
  userId?: string | null;
  db?: Db;
  later?: (work: () => Promise<unknown>) => void;
}

/** What a handler checks, readable by the test that every route goes through this wrapper. */
export interface RouteRule {
  access?: Access;
  check?: PublicCheck;
  /** The content types its body may have (empty: it takes no body). */
  takes: readonly string[];
  /** It reads a query (checked by a schema). */
  readsQuery: boolean;
  /** Its JSON body's texts are taken as sent (`json(…, { anyText: true })`): its schema and writer make them storable. */
  textsTakenAsSent: boolean;
  /** The schemas its JSON body and its query are checked with (read by the test that bounds every field). */
  schemas: { body?: z.ZodType; query?: z.ZodType };
}

export interface RouteHandler<R> {
  (req: Request, ctx: { params: Promise<RawParams> }): Promise<Response>;
  /** The same handler, with the user and database given (integration tests). */
  handle(req: Request, opts?: CallOptions): Promise<Response>;
  readonly rule: RouteRule;
  /** Phantom: the JSON the handler answers with on success (see `ReplyOf`). */
  readonly __reply?: R;
}

/** The success body of a route handler: `ReplyOf<typeof GET>`. */
export type ReplyOf<H> = H extends RouteHandler<infer R> ? (R extends Response ? never : R extends JsonReply<infer T> ? T : R) : never;

const MUTATING = new Set(["POST", "PUT", "PATCH", "DELETE"]);
const NO_STORE = { "cache-control": "no-store" };

export function refusalResponse(status: number, error: string, issues: FieldIssue[] = []): Response {
  return NextResponse.json(errorBody(error, issues), { status, headers: NO_STORE });
}

function answerFailure(e: unknown): Response {
  if (e instanceof Refusal) return refusalResponse(e.status, e.message, e.issues);
  if (isZodError(e)) return refusalResponse(400, CHECK_THE_FIELDS, issuesOf(e));
  if (isDatabaseFailure(e)) {
    console.error("[route] database failure:", e instanceof Error ? e.message : e);
    return refusalResponse(503, DATABASE_NOT_ANSWERING);
  }
  console.error("[route] unexpected error", e);
  // one answer for every server error: 503 with the one body; the log says which kind it was
  return refusalResponse(503, UNEXPECTED_FAILURE);
}

function isZodError(e: unknown): e is z.ZodError {
  return (
    typeof e === "object" &&
    e !== null &&
    (e as { name?: unknown }).name === "ZodError" &&
    Array.isArray((e as { issues?: unknown }).issues)
  );
}

function toResponse(result: unknown): Response {
  if (result instanceof Response) return result;
  if (result instanceof JsonReply) {
    const headers = new Headers(result.init.headers);
    if (!headers.has("cache-control")) headers.set("cache-control", "no-store");
    return NextResponse.json(result.body, { ...result.init, headers });
  }
  return NextResponse.json(result ?? null, { headers: NO_STORE });
}

function mediaType(req: Request): string {
  return (req.headers.get("content-type") ?? "").split(";")[0].trim().toLowerCase();
}

async function readBody(req: Request, spec: BodySpec | undefined): Promise<unknown> {
  const type = mediaType(req);
  if (!spec) {
    // No body taken: a state-changing request may carry an empty JSON body, nothing else.
    if (MUTATING.has(req.method) && type && type !== "application/json")
      throw new Refusal(`This request takes no body; ${type} was sent.`, 415);
    return undefined;
  }
  const wanted = spec.kind === "json" ? ["application/json"] : spec.kind === "multipart" ? ["multipart/form-data"] : spec.types;
  if (!wanted.includes(type)) throw new Refusal(`This request takes ${wanted.join(" or ")}; ${type || "no type"} was sent.`, 415);
  if (spec.kind === "multipart") {
    const form = await readMultipart(req, spec);
    const issues: FieldIssue[] = [];
    form.forEach((value, key) => {
      if (typeof value === "string") issues.push(...unstorableTextIssues({ [key]: value }, undefined));
    });
    if (issues.length) throw new Refusal(CHECK_THE_FIELDS, 400, issues.slice(0, 50));
    return form;
  }
  if (spec.kind === "binary") {
    const declared = req.headers.get("content-length");
    if (declared !== null && Number(declared) > spec.maxBytes)
      throw new Refusal(`The body is ${declared} bytes; the limit is ${spec.maxBytes} bytes.`, 413);
    const body: BinaryBody = {
      type,
      read: (maxBytes = spec.maxBytes) =>
        readLimited(req, { maxBytes: Math.min(maxBytes, spec.maxBytes), tooLargeHint: spec.tooLargeHint }),
    };
    return body;
  }
  const bytes = await readLimited(req, spec);
  switch (spec.kind) {
    case "text":
      return utf8(bytes);
    case "json": {
      const text = utf8(bytes);
      if (!text.trim()) throw new Refusal(spec.emptyMessage ?? "The body is empty: send the form's fields as JSON.", 400);
      let raw: unknown;
      try {
        raw = JSON.parse(text);
      } catch {
        throw new Refusal("The body is not valid JSON: nothing was changed. Send the form again.", 400);
      }
      spec.before?.(raw);
      return checkedFields(spec.schema, raw, spec.labels, { texts: !spec.anyText, ...spec.invalid });
    }
  }
}

/**
 * `value` parsed by `schema`, with every text PostgreSQL cannot store refused too (unless `texts`
 * is false); else a Refusal naming each field (at most 50).
 */
function checkedFields(
  schema: z.ZodType,
  value: unknown,
  labels: FieldLabels | undefined,
  refusal: { texts?: boolean; status?: 400 | 422; error?: string } = {},
): unknown {
  const { texts = true, status = 400, error = CHECK_THE_FIELDS } = refusal;
  const parsed = schema.safeParse(value, { error: workshopErrors(labels) });
  const issues = parsed.success ? [] : issuesOf(parsed.error, { max: 50 });
  if (texts) issues.push(...unstorableTextIssues(value, labels, issues));
  if (issues.length) throw new Refusal(error, status, issues.slice(0, 50));
  return parsed.data;
}

/**
 * The texts of a body, query or form that PostgreSQL cannot store (a NUL, another control
 * character, half of an emoji), each named in workshop words, except where the schema has said
 * what is wrong with that field already (`safeText` says it in the field's own words). Such a
 * text is refused before anything reads it: it would otherwise fail the database write as a
 * server error.
 */
function unstorableTextIssues(value: unknown, labels: FieldLabels | undefined, known: readonly FieldIssue[] = []): FieldIssue[] {
  const said = new Set(known.map((i) => i.path));
  return unstorableTexts(value, (path) => fieldLabel(path, labels))
    .map((f) => ({ path: f.path.map(String).join("."), message: f.message }))
    .filter((i) => !said.has(i.path));
}

function utf8(bytes: Uint8Array): string {
  try {
    return new TextDecoder("utf-8", { fatal: true }).decode(bytes);
  } catch {
    throw new Refusal("The body is not UTF-8 text.", 400);
  }
}

function readQuery(req: Request, schema: z.ZodType | undefined, labels?: FieldLabels): unknown {
  if (!schema) return undefined;
  return checkedFields(schema, Object.fromEntries(new URL(req.url).searchParams), labels);
}

function pickParams(names: readonly string[], raw: RawParams = {}): Record<string, string> {
  const out: Record<string, string> = {};
  for (const n of names) {
    const v = raw[n];
    out[n] = Array.isArray(v) ? v.join("/") : (v ?? "");
  }
  return out;
}

type Asking = { user: SessionUser; sessionId: string | null } | { refused: SessionState };

async function whoIsAsking(opts: CallOptions, db: Db): Promise<Asking> {
  if (opts.user !== undefined) return opts.user ? { user: opts.user, sessionId: null } : { refused: "expired" };
  if (opts.userId !== undefined) {
    // A session naming an id that is not a UUID names nobody (never a database error).
    const user = opts.userId && isUuid(opts.userId) ? await loadSessionUser(db, opts.userId) : null;
    return user ? { user, sessionId: null } : { refused: "expired" };
  }
  // next-auth loads only when a real request needs it (tests and scripts hand in the user).
  return (await import("./session")).lookUpSession(db);
}

/** 401, saying whether the session was ended on the server (the tablet then lets go of its data). */
function notSignedIn(state: SessionState): Response {
  const res = refusalResponse(401, state === "ended" ? "Your session was ended: sign in again." : "Sign in first.");
  res.headers.set(SESSION_STATE_HEADER, state);
  return res;
}

function mayPass(user: SessionUser, access: Access): boolean {
  if ("signedIn" in access) return true;
  if ("area" in access) return canReach(user.role, access.area);
  return access.anyArea.some((a) => canReach(user.role, a));
}

interface Spec<N extends readonly string[], B, Q> {
  params?: N;
  body?: B;
  query?: Q;
  queryLabels?: FieldLabels;
}

function build<R>(
  spec: Spec<readonly string[], BodySpec | undefined, z.ZodType | undefined>,
  gate: { access: Access } | { publicCheck: PublicCheck },
  run: (ctx: RouteContext<Record<string, string>, unknown, unknown, SessionUser | null>) => Promise<R>,
): RouteHandler<R> {
  async function handle(req: Request, opts: CallOptions = {}): Promise<Response> {
    try {
      const originChecked = !("publicCheck" in gate && gate.publicCheck === "payment-signature");
      if (originChecked && MUTATING.has(req.method) && !isSameOrigin(req)) {
        return refusalResponse(403, NOT_FROM_OUR_PAGES);
      }
      const db = opts.db ?? sharedDb();
      let user: SessionUser | null = null;
      let sessionId: string | null = null;
      if ("access" in gate) {
        const asking = await whoIsAsking(opts, db);
        if ("refused" in asking) return notSignedIn(asking.refused);
        ({ user, sessionId } = asking);
        if (!mayPass(user, gate.access)) return refusalResponse(403, `Your role (${user.role}) may not use this.`);
      }
      const params = pickParams(spec.params ?? [], opts.params);
      const query = readQuery(req, spec.query, spec.queryLabels);
      const body = await readBody(req, spec.body);
      const later =
        opts.later ??
        (opts.db || opts.user !== undefined || opts.userId !== undefined ? () => undefined : (work: () => Promise<unknown>) => after(work));
      return toResponse(await run({ req, user, params, body, query, db, sessionId, later }));
    } catch (e) {
      return answerFailure(e);
    }
  }
  const handler = (async (req: Request, ctx: { params: Promise<RawParams> }) =>
    handle(req, { params: ctx?.params ? await ctx.params : {} })) as RouteHandler<R>;
  const body = spec.body;
  const takes = !body
    ? []
    : body.kind === "json"
      ? ["application/json"]
      : body.kind === "multipart"
        ? ["multipart/form-data"]
        : [...body.types];
  const checks = {
    takes,
    readsQuery: spec.query !== undefined,
    textsTakenAsSent: body?.kind === "json" && body.anyText === true,
    schemas: { body: body?.kind === "json" ? body.schema : undefined, query: spec.query },
  };
  const rule: RouteRule = "access" in gate ? { access: gate.access, ...checks } : { check: gate.publicCheck, ...checks };
  return Object.assign(handler, { handle, rule });
}

/** A route for signed-in users whose role reaches `access`. */
export function route<
  const N extends readonly string[] = [],
  B extends BodySpec | undefined = undefined,
  Q extends z.ZodType | undefined = undefined,
  R = unknown,
>(
  spec: Spec<N, B, Q> & { access: Access },
  handler: (ctx: RouteContext<ParamsOf<N>, BodyOf<B>, Q extends z.ZodType ? z.output<Q> : undefined, SessionUser>) => Promise<R>,
): RouteHandler<R> {
  return build(spec, { access: spec.access }, handler as never);
}

/** A route no session guards; `check` names what it checks instead (see PublicCheck). */
export function publicRoute<const N extends readonly string[] = [], B extends BodySpec | undefined = undefined, R = unknown>(
  spec: Spec<N, B, undefined> & { check: PublicCheck },
  handler: (ctx: RouteContext<ParamsOf<N>, BodyOf<B>, undefined, null>) => Promise<R>,
): RouteHandler<R> {
  return build(spec, { publicCheck: spec.check }, handler as never);
}

/** A route parameter that must be a UUID; anything else is "not found" (never a 500). */
export function idParam(value: string, what = "Not found."): string {
  if (!isUuid(value)) throw new Refusal(what, 404);
  return value;
}
