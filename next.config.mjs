/**
 * Next.js configuration for Edgefield.
 * - distDir: each helper, the e2e run and production use their own build folder (NEXT_DIST_DIR).
 * - serverExternalPackages: PGlite ships WASM + data files that must be loaded from node_modules.
 * Security headers come with the hardening issue.
 * @type {import('next').NextConfig}
 */
const nextConfig = {
  distDir: process.env.NEXT_DIST_DIR || '.next',
  serverExternalPackages: ['@electric-sql/pglite'],
  typedRoutes: false,
  poweredByHeader: false,
  reactStrictMode: true,
};

export default nextConfig;
