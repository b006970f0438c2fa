// Requests for calling route handlers directly (`GET.handle(req, { user, db, params })`), as a
// page of the app would send them: on the app's own origin, with the Origin header a browser sends
// on every state-changing request (the route wrapper refuses a post without it).
export const APP_ORIGIN = "http://benchtag.test";

export function appRequest(path: string, init: RequestInit & { duplex?: "half" } = {}): Request {
  const headers = new Headers(init.headers);
  const method = (init.method ?? "GET").toUpperCase();
  if (method !== "GET" && method !== "HEAD" && !headers.has("origin")) headers.set("origin", APP_ORIGIN);
  return new Request(new URL(path, APP_ORIGIN), {
    ...init,
    headers,
    ...(init.body instanceof ReadableStream ? { duplex: "half" } : {}),
  } as RequestInit);
}
