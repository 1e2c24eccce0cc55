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
    return [{ source: "/:path*", headers: securityHeaders }];
  },
};

export default nextConfig;
