// Security headers on every answer (README "Security headers"). Pages get their
// Content-Security-Policy, with a nonce, from proxy.ts; everything else gets one here.
const production = process.env.NODE_ENV === "production";

const everyAnswer = [
  { key: "X-Frame-Options", value: "DENY" },
  { key: "X-Content-Type-Options", value: "nosniff" },
  { key: "Referrer-Policy", value: "same-origin" },
  // The bench scans QR tags with the camera; nothing else is used.
  {
    key: "Permissions-Policy",
    value: "camera=(self), microphone=(), geolocation=(), payment=(), usb=(), serial=(), bluetooth=(), hid=(), midi=(), display-capture=()",
  },
  { key: "Cross-Origin-Opener-Policy", value: "same-origin" },
  { key: "Cross-Origin-Resource-Policy", value: "same-origin" },
  ...(production ? [{ key: "Strict-Transport-Security", value: "max-age=31536000; includeSubDomains" }] : []),
];
// API answers, files and images: nothing in them may run or be framed.
const NOT_A_PAGE = "default-src 'none'; frame-ancestors 'none'; base-uri 'none'; form-action 'none'";
// The service worker fetches our own files only.
const WORKER = "default-src 'self'; script-src 'self'; object-src 'none'; base-uri 'none'; frame-ancestors 'none'";
const csp = (value) => [{ key: "Content-Security-Policy", value }];

/** @type {import('next').NextConfig} */
const nextConfig = {
  reactStrictMode: true,
  poweredByHeader: false,
  // pdfkit reads its standard-font metrics from its own folder at run time; pg-boss is the queue
  // (app/_server/queue/) and runs as Node loads it: keep both unbundled.
  serverExternalPackages: ["pdfkit", "pg-boss"],
  // Pages take no body: the proxy copies at most this much of one (proxy.ts never matches /api/).
  experimental: { proxyClientMaxBodySize: 64 * 1024 },
  // html5-qrcode's decoder imports a 1.1 MB ZXing build with every barcode format; a bike's tag is
  // a QR code, so that import is served the QR reader alone (app/bench/_scanner/zxing-qr-only.ts).
  turbopack: { resolveAlias: { "../third_party/zxing-js.umd": "./app/bench/_scanner/zxing-qr-only.ts" } },
  // The service worker (public/sw.js) is built by `serwist build` after `next build`.
  async headers() {
    return [
      { source: "/:path*", headers: everyAnswer },
      { source: "/api/:path*", headers: csp(NOT_A_PAGE) },
      { source: "/_next/:path*", headers: csp(NOT_A_PAGE) },
      { source: "/icons/:path*", headers: csp(NOT_A_PAGE) },
      { source: "/manifest.webmanifest", headers: csp(NOT_A_PAGE) },
      { source: "/favicon.ico", headers: csp(NOT_A_PAGE) },
      { source: "/:file(swe-worker-.*\\.js)", headers: csp(WORKER) },
      {
        source: "/sw.js",
        headers: [
          { key: "Cache-Control", value: "no-cache, no-store, must-revalidate" },
          { key: "Service-Worker-Allowed", value: "/" },
          ...csp(WORKER),
        ],
      },
    ];
  },
};

export default nextConfig;
