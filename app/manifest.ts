import type { MetadataRoute } from "next";

/** Lets people install the console on a phone, so notices open it like an app. */
export default function manifest(): MetadataRoute.Manifest {
  return {
    name: "Joulepath",
    short_name: "Joulepath",
    description: "Rules, tests and notices for a building's battery-free switches, sensors and lights.",
    start_url: "/sites",
    scope: "/",
    display: "standalone",
    background_color: "#f3f5f2",
    theme_color: "#1d2833",
    icons: [
      { src: "/icons/icon-192.png", sizes: "192x192", type: "image/png", purpose: "any" },
      { src: "/icons/icon-512.png", sizes: "512x512", type: "image/png", purpose: "any" },
      { src: "/icons/icon-maskable-512.png", sizes: "512x512", type: "image/png", purpose: "maskable" },
    ],
  };
}
