// A small local stand-in for the payment provider's HTTP API — only what Benchtag uses:
//   POST /v1/payment_intents            create (amount, currency, description, metadata[…]); Idempotency-Key honoured
//   GET  /v1/payment_intents/:id        retrieve
//   POST /v1/payment_intents/:id/confirm  with payment_method; "pm_card_chargeDeclined" fails, any other succeeds
//   POST /v1/refunds                    payment_intent (succeeded), amount (default: what is left): charge.refunded
//                                       (the shop's refund in the provider's dashboard)
//   POST /v1/webhook_endpoints          register a URL to receive events (deduplicated by URL)
//   GET  /v1/events                     events sent so far, newest first
//   GET  /_fake/deliveries              every webhook delivery with the app's answer (for tests)
//   GET  /_fake/health
// Events are signed with the provider's scheme (stripe.webhooks.generateTestHeaderString) using
// FAKE_PAYMENTS_WEBHOOK_SECRET and POSTed to every registered endpoint.
// Port: FAKE_PAYMENTS_PORT (default 12111). First endpoint: FAKE_PAYMENTS_WEBHOOK_URL.
import { randomBytes } from "node:crypto";
import http from "node:http";
import Stripe from "stripe";

const port = Number(process.env.FAKE_PAYMENTS_PORT ?? 12111);
const secret = process.env.FAKE_PAYMENTS_WEBHOOK_SECRET ?? process.env.STRIPE_WEBHOOK_SECRET ?? "whsec_benchtag_local";
const endpoints: Array<{ id: string; url: string }> = [];
if (process.env.FAKE_PAYMENTS_WEBHOOK_URL) endpoints.push({ id: newId("we"), url: process.env.FAKE_PAYMENTS_WEBHOOK_URL });

type Obj = Record<string, unknown>;
const intents = new Map<string, Obj>();
const idempotent = new Map<string, { status: number; body: Obj }>();
const events: Obj[] = [];
const deliveries: Array<{ eventId: string; url: string; status: number | null; answer: string; at: string }> = [];

function newId(prefix: string) {
  return `${prefix}_fake${randomBytes(10).toString("hex")}`;
}

// Form bodies as the SDK sends them: a=1&metadata[k]=v&list[0]=x
export function parseForm(text: string): Obj {
  const out: Obj = {};
  for (const [k, v] of new URLSearchParams(text)) {
    const parts = k.split(/\[|\]/).filter(Boolean);
    let cur: Obj = out;
    parts.forEach((p, i) => {
      if (i === parts.length - 1) cur[p] = v;
      else cur = (cur[p] ??= {}) as Obj;
    });
  }
  return out;
}

function send(res: http.ServerResponse, status: number, body: unknown) {
  res.writeHead(status, { "content-type": "application/json", "request-id": newId("req") });
  res.end(JSON.stringify(body));
}
const fail = (res: http.ServerResponse, status: number, message: string, param?: string) =>
  send(res, status, { error: { type: "invalid_request_error", message, ...(param ? { param } : {}) } });

async function emit(type: string, object: Obj) {
  const event = {
    id: newId("evt"),
    object: "event",
    api_version: "2026-10-28.endive",
    created: Math.floor(Date.now() / 1000),
    livemode: false,
    type,
    data: { object },
    pending_webhooks: endpoints.length,
  };
  events.unshift(event);
  const payload = JSON.stringify(event);
  for (const ep of endpoints) {
    const header = Stripe.webhooks.generateTestHeaderString({ payload, secret });
    try {
      const r = await fetch(ep.url, {
        method: "POST",
        headers: { "content-type": "application/json", "stripe-signature": header },
        body: payload,
        signal: AbortSignal.timeout(5000),
      });
      deliveries.unshift({
        eventId: event.id,
        url: ep.url,
        status: r.status,
        answer: (await r.text()).slice(0, 300),
        at: new Date().toISOString(),
      });
    } catch (e) {
      deliveries.unshift({ eventId: event.id, url: ep.url, status: null, answer: (e as Error).message, at: new Date().toISOString() });
    }
  }
}

async function handle(req: http.IncomingMessage, res: http.ServerResponse) {
  const url = new URL(req.url ?? "/", `http://127.0.0.1:${port}`);
  const chunks: Buffer[] = [];
  for await (const c of req) chunks.push(c as Buffer);
  const body = parseForm(Buffer.concat(chunks).toString("utf8"));

  if (url.pathname === "/_fake/health") return send(res, 200, { ok: true, endpoints: endpoints.map((e) => e.url) });
  if (url.pathname === "/_fake/deliveries") return send(res, 200, { data: deliveries });

  const auth = req.headers.authorization ?? "";
  if (!/^Bearer sk_test_\w+/.test(auth)) return fail(res, 401, "Invalid API key provided (the fake accepts sk_test_… keys only).");

  const key = req.headers["idempotency-key"];
  const idemKey = typeof key === "string" && req.method === "POST" ? `${url.pathname}|${key}` : null;
  if (idemKey && idempotent.has(idemKey)) {
    const prior = idempotent.get(idemKey)!;
    return send(res, prior.status, prior.body);
  }
  const remember = (status: number, out: Obj) => {
    if (idemKey) idempotent.set(idemKey, { status, body: out });
    send(res, status, out);
  };

  if (req.method === "POST" && url.pathname === "/v1/payment_intents") {
    const amount = Number(body.amount);
    if (!Number.isInteger(amount) || amount < 1)
      return fail(res, 400, "amount must be a positive integer in the smallest currency unit", "amount");
    if (typeof body.currency !== "string" || !/^[a-z]{3}$/.test(body.currency))
      return fail(res, 400, "currency must be a three-letter lower-case code", "currency");
    const id = newId("pi");
    const pi = {
      id,
      object: "payment_intent",
      amount,
      currency: body.currency,
      description: body.description ?? null,
      metadata: body.metadata ?? {},
      status: "requires_payment_method",
      client_secret: `${id}_secret_${randomBytes(6).toString("hex")}`,
      created: Math.floor(Date.now() / 1000),
      livemode: false,
      payment_method: null,
    };
    intents.set(id, pi);
    return remember(200, pi);
  }
  const m = /^\/v1\/payment_intents\/([\w]+)(\/confirm)?$/.exec(url.pathname);
  if (m) {
    const pi = intents.get(m[1]);
    if (!pi) return fail(res, 404, `No such payment_intent: '${m[1]}'`, "intent");
    if (req.method === "GET" && !m[2]) return send(res, 200, pi);
    if (req.method === "POST" && m[2]) {
      if (pi.status === "succeeded") return fail(res, 400, "This PaymentIntent has already succeeded.");
      const pm = typeof body.payment_method === "string" ? body.payment_method : "";
      if (!pm) return fail(res, 400, "payment_method is required", "payment_method");
      pi.payment_method = pm;
      pi.status = pm === "pm_card_chargeDeclined" ? "requires_payment_method" : "succeeded";
      remember(200, { ...pi });
      setTimeout(() => void emit(pi.status === "succeeded" ? "payment_intent.succeeded" : "payment_intent.payment_failed", { ...pi }), 50);
      return;
    }
  }
  if (req.method === "POST" && url.pathname === "/v1/refunds") {
    const pi = typeof body.payment_intent === "string" ? intents.get(body.payment_intent) : undefined;
    if (!pi) return fail(res, 404, `No such payment_intent: '${String(body.payment_intent)}'`, "payment_intent");
    if (pi.status !== "succeeded") return fail(res, 400, "This PaymentIntent has not succeeded: there is nothing to refund.");
    const already = Number(pi.amount_refunded ?? 0);
    const amount = body.amount === undefined ? Number(pi.amount) - already : Number(body.amount);
    if (!Number.isInteger(amount) || amount < 1 || already + amount > Number(pi.amount))
      return fail(res, 400, "amount must be a positive integer no more than what is left to refund", "amount");
    pi.amount_refunded = already + amount;
    const refund = { id: newId("re"), object: "refund", amount, currency: pi.currency, payment_intent: pi.id, status: "succeeded" };
    remember(200, refund);
    const charge = {
      id: newId("ch"),
      object: "charge",
      payment_intent: pi.id,
      amount: pi.amount,
      amount_refunded: pi.amount_refunded,
      currency: pi.currency,
      refunded: pi.amount_refunded === pi.amount,
    };
    setTimeout(() => void emit("charge.refunded", charge), 50);
    return;
  }
  if (req.method === "POST" && url.pathname === "/v1/webhook_endpoints") {
    if (typeof body.url !== "string" || !/^https?:\/\//.test(body.url)) return fail(res, 400, "url must be an http(s) address", "url");
    let ep = endpoints.find((e) => e.url === body.url);
    if (!ep) endpoints.push((ep = { id: newId("we"), url: body.url }));
    return remember(200, {
      id: ep.id,
      object: "webhook_endpoint",
      url: ep.url,
      enabled_events: ["*"],
      secret,
      status: "enabled",
      livemode: false,
    });
  }
  if (req.method === "GET" && url.pathname === "/v1/events") {
    const limit = Math.min(100, Number(url.searchParams.get("limit") ?? 10) || 10);
    return send(res, 200, { object: "list", data: events.slice(0, limit), has_more: events.length > limit, url: "/v1/events" });
  }
  return fail(res, 404, `Unrecognized request URL (${req.method}: ${url.pathname}).`);
}

http
  .createServer((req, res) => {
    handle(req, res).catch((e) => fail(res, 500, (e as Error).message));
  })
  .listen(port, "127.0.0.1", () => console.log(`[fake-payments] listening on 127.0.0.1:${port}`));
