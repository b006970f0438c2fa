import "server-only";
import { clientAddress, parseTrustedHops, PEER_HEADER } from "@/lib/auth/client-address";

// The client address of a request (lib/auth/client-address.ts has the rule). The connection
// address is believed only when our server (server.mjs) stamped it: it marks itself on
// globalThis, so under a plain `next start` a client-sent x-benchtag-peer header is ignored.
const STAMPED = Symbol.for("benchtag.peer-stamped");
let warned = false;

type HeaderBag = Headers | Record<string, unknown> | undefined;

function header(headers: HeaderBag, name: string): string | null {
  if (!headers) return null;
  if (headers instanceof Headers) return headers.get(name);
  const v = headers[name];
  return typeof v === "string" ? v : Array.isArray(v) ? String(v[0]) : null;
}

export function requestClientAddress(headers: HeaderBag): string {
  const stamped = (globalThis as Record<symbol, unknown>)[STAMPED] === true;
  const hops = parseTrustedHops(process.env.TRUSTED_PROXY_HOPS);
  if (!stamped && hops === 0 && !warned) {
    warned = true;
    console.warn(
      "[sign-in] The connection address is unknown (the app was not started by server.mjs) and TRUSTED_PROXY_HOPS is 0: every client counts as one address.",
    );
  }
  return clientAddress({ peer: stamped ? header(headers, PEER_HEADER) : null, forwardedFor: header(headers, "x-forwarded-for"), hops });
}
