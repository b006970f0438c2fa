// The client address a sign-in is counted against. Taken from a proxy only when the setting says
// one is trusted (TRUSTED_PROXY_HOPS): a client's own X-Forwarded-For is never believed by default.
//
//   hops = 0 (default): the address of the TCP connection, stamped on the request by our server
//     (server.mjs, header `x-benchtag-peer`, replaced on every request so a client cannot send it);
//   hops = N: the address N entries from the right of [X-Forwarded-For…, connection address] —
//     the one the outermost trusted proxy saw. Entries further left were written by the client.
// IPv6 addresses count by their /64 network (one home or one server usually holds a whole /64).

export const PEER_HEADER = "x-benchtag-peer";

export interface AddressSources {
  /** The connection's address, when our server stamped it; null when it did not run. */
  peer: string | null;
  forwardedFor: string | null;
  hops: number;
}

export function parseTrustedHops(raw: string | undefined): number {
  return raw && /^\d{1,2}$/.test(raw) ? Number(raw) : 0;
}

export function clientAddress({ peer, forwardedFor, hops }: AddressSources): string {
  const forwarded = (forwardedFor ?? "")
    .split(",")
    .map((s) => s.trim())
    .filter(Boolean);
  const chain = peer ? [...forwarded, peer] : forwarded;
  if (hops === 0) return peer ? addressKey(peer) : "unknown";
  // Without the stamp (a plain `next start`), the connection address is not in the chain: the
  // last forwarded entry is the one the nearest proxy wrote.
  const index = peer ? chain.length - 1 - hops : chain.length - hops;
  const picked = chain[Math.max(0, index)];
  return picked ? addressKey(picked) : "unknown";
}

/** An address as a throttle key: IPv4 as is (also when mapped into IPv6), IPv6 by its /64. */
export function addressKey(raw: string): string {
  let a = raw.trim().toLowerCase();
  if (a.startsWith("[")) a = a.slice(1, a.indexOf("]") > 0 ? a.indexOf("]") : undefined);
  const mapped = /^::ffff:(\d{1,3}(?:\.\d{1,3}){3})$/.exec(a);
  if (mapped) return mapped[1];
  if (/^\d{1,3}(?:\.\d{1,3}){3}(?::\d+)?$/.test(a)) return a.split(":")[0];
  if (!a.includes(":")) return a.slice(0, 64) || "unknown";
  const groups = expandIpv6(a.split("%")[0]);
  return groups ? `${groups.slice(0, 4).join(":")}::/64` : a.slice(0, 64);
}

function expandIpv6(a: string): string[] | null {
  const [head, tail, ...rest] = a.split("::");
  if (rest.length) return null;
  const h = head ? head.split(":") : [];
  const t = tail !== undefined ? (tail ? tail.split(":") : []) : null;
  const groups = t === null ? h : [...h, ...Array(8 - h.length - t.length).fill("0"), ...t];
  if (groups.length !== 8 || groups.some((g) => !/^[0-9a-f]{1,4}$/.test(g))) return null;
  return groups.map((g) => g.replace(/^0+(?=.)/, ""));
}
