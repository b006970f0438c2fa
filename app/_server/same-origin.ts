import "server-only";
// The same-origin check for state-changing requests (POST, PUT, PATCH, DELETE), so another site
// cannot make a signed-in browser change anything here (cross-site request forgery).
//
// A request passes when its `Origin` header is the app's own origin — the origin the request was
// made to (its URL, or its Host header) or the public address in NEXTAUTH_URL — or when the
// browser says `Sec-Fetch-Site: same-origin`. Browsers send at least one of the two on every
// state-changing request from our pages (fetch, forms, the service worker), so a request with
// neither header is refused too: it did not come from a page of ours. Scripts and tests that
// post must send `Origin` themselves.

export const NOT_FROM_OUR_PAGES = "This request did not come from a Benchtag page, so nothing was done. Use the app's own pages.";

function ownOrigins(req: Request): Set<string> {
  const url = new URL(req.url);
  const own = new Set([url.origin]);
  const host = req.headers.get("host");
  if (host) own.add(`${url.protocol}//${host}`);
  const configured = process.env.NEXTAUTH_URL;
  if (configured) {
    try {
      own.add(new URL(configured).origin);
    } catch {
      // a malformed NEXTAUTH_URL adds nothing
    }
  }
  return own;
}

export function isSameOrigin(req: Request): boolean {
  const origin = req.headers.get("origin");
  if (origin && origin !== "null" && ownOrigins(req).has(origin)) return true;
  return req.headers.get("sec-fetch-site") === "same-origin";
}
