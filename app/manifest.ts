import type { MetadataRoute } from "next";

export default function manifest(): MetadataRoute.Manifest {
  return {
    name: "Benchtag",
    short_name: "Benchtag",
    description: "Workshop records for engine builds, from intake to handover.",
    start_url: "/bench",
    scope: "/",
    display: "standalone",
    orientation: "any",
    background_color: "#f7f5f0",
    theme_color: "#161b20",
    icons: [
      { src: "/icons/icon-192.png", sizes: "192x192", type: "image/png" },
      { src: "/icons/icon-512.png", sizes: "512x512", type: "image/png" },
      { src: "/icons/icon-maskable-512.png", sizes: "512x512", type: "image/png", purpose: "maskable" },
    ],
  };
}
