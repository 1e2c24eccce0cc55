import type { NextConfig } from "next";
import path from "node:path";

const securityHeaders = [
  { key: "X-Content-Type-Options", value: "nosniff" },
  { key: "Referrer-Policy", value: "strict-origin-when-cross-origin" },
  { key: "X-Frame-Options", value: "DENY" },
  { key: "Permissions-Policy", value: "camera=(), microphone=(), geolocation=()" },
];

const nextConfig: NextConfig = {
  reactStrictMode: true,
  poweredByHeader: false,
  // NEXT_DIST_DIR lets two engineers build and browser-test side by side in one working tree (scripts/e2e-slot.sh).
  ...(process.env.NEXT_DIST_DIR ? { distDir: process.env.NEXT_DIST_DIR } : {}),
  // `npm test` type-checks the whole repository (tsc --noEmit) before it builds; the build need not repeat it.
  typescript: { ignoreBuildErrors: true },
  turbopack: { root: path.resolve(__dirname) },
  serverExternalPackages: ["@libsql/client", "libsql", "bcryptjs", "smtp-server", "mailparser", "xlsx-populate", "docx", "@resvg/resvg-js"],
  async headers() {
    // HSTS only where the browser reached Ballast over HTTPS (told by the TLS proxy in front), or always with
    // BALLAST_HSTS=1; over plain HTTP (loopback, the demo) browsers ignore it anyway, and it would only mislead.
    const hsts = { key: "Strict-Transport-Security", value: "max-age=31536000; includeSubDomains" };
    return [
      { source: "/:path*", headers: process.env.BALLAST_HSTS === "1" ? [...securityHeaders, hsts] : securityHeaders },
      { source: "/:path*", has: [{ type: "header", key: "x-forwarded-proto", value: "https" }], headers: [hsts] },
    ];
  },
};

export default nextConfig;
