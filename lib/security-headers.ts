// The Content-Security-Policy of our pages, with a fresh nonce per response (proxy.ts sets it on
// the request, where Next reads it and puts it on its own scripts, and on the response). Scripts
// run only with the nonce, or when loaded by one that has it ('strict-dynamic': Next's chunks);
// no page may be framed. Inline style *attributes* are allowed (style-src-attr): server-rendered
// React style props (charts, progress bars) arrive as attributes; <style> elements still need the
// nonce. The other headers (X-Frame-Options, nosniff, Referrer-Policy, Permissions-Policy, HSTS,
// and the policies of API answers, static files and the service worker) are in next.config.mjs.

export function pageSecurityPolicy(nonce: string, opts: { dev: boolean }): string {
  const directives: Record<string, string> = {
    "default-src": "'self'",
    "script-src": `'self' 'nonce-${nonce}' 'strict-dynamic'${opts.dev ? " 'unsafe-eval'" : ""}`,
    "style-src": opts.dev ? "'self' 'unsafe-inline'" : `'self' 'nonce-${nonce}'`,
    "style-src-attr": "'unsafe-inline'",
    // data: QR tags drawn by the qrcode package; blob: photos kept on the tablet.
    "img-src": "'self' data: blob:",
    "font-src": "'self'",
    "connect-src": "'self'",
    // the camera's stream and the timer's alarm sound
    "media-src": "'self' blob: data:",
    "worker-src": "'self'",
    "manifest-src": "'self'",
    "object-src": "'none'",
    "base-uri": "'none'",
    "form-action": "'self'",
    "frame-src": "'none'",
    "frame-ancestors": "'none'",
  };
  return Object.entries(directives)
    .map(([k, v]) => `${k} ${v}`)
    .join("; ");
}
