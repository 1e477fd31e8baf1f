/** @type {import('next').NextConfig} */
const nextConfig = {
  // Native/bundled-asset packages stay outside the server bundle.
  serverExternalPackages: ["@libsql/client", "libsql", "pdfkit", "dxf-parser"],
  poweredByHeader: false,
  typescript: { ignoreBuildErrors: false },
};

export default nextConfig;
