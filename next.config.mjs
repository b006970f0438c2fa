/** @type {import('next').NextConfig} */
const nextConfig = {
  reactStrictMode: true,
  poweredByHeader: false,
  // pdfkit reads its standard-font metrics from its own folder at run time: keep it unbundled.
  serverExternalPackages: ["pdfkit"],
  // The service worker (public/sw.js) is built by `serwist build` after `next build`.
  async headers() {
    return [
      {
        source: "/sw.js",
        headers: [
          { key: "Cache-Control", value: "no-cache, no-store, must-revalidate" },
          { key: "Service-Worker-Allowed", value: "/" },
        ],
      },
    ];
  },
};

export default nextConfig;
