import createNextIntlPlugin from "next-intl/plugin";

// next-intl reads i18n/request.ts for each request's language and messages.
const withNextIntl = createNextIntlPlugin();

/** @type {import('next').NextConfig} */
const nextConfig = {
  // Database drivers, the job queue and native-ish libraries stay outside the bundle.
  serverExternalPackages: ["sequelize", "pg", "pg-hstore", "pg-boss", "umzug", "bcryptjs", "nodemailer", "pdf-lib", "@pdf-lib/fontkit", "@signpdf/signpdf", "@signpdf/signer-p12", "@signpdf/placeholder-pdf-lib", "node-forge", "@aws-sdk/client-s3"],
  // The tests build into their own folder so they can run while the demo is up.
  distDir: process.env.NEXT_DIST_DIR || ".next",
  poweredByHeader: false,
  // The benchmark's own build skips the type check; `npm test` builds with it.
  typescript: { ignoreBuildErrors: process.env.CUSPAL_SKIP_TYPECHECK === "1" },
  async headers() {
    return [
      // API answers hold personal data: never cached. Set here rather than in proxy.ts, which pages need
      // and API requests would only pay for.
      { source: "/api/:path*", headers: [{ key: "Cache-Control", value: "no-store" }] },
      // HSTS over https only, as a TLS proxy says with X-Forwarded-Proto (the value and the test match
      // lib/server/security-headers.ts, which the proxy uses for pages).
      {
        source: "/api/:path*",
        has: [{ type: "header", key: "x-forwarded-proto", value: "(?:https|HTTPS)(?:\\s*,.*)?" }],
        headers: [{ key: "Strict-Transport-Security", value: "max-age=63072000; includeSubDomains" }],
      },
      {
        source: "/:path*",
        headers: [
          { key: "X-Content-Type-Options", value: "nosniff" },
          { key: "Referrer-Policy", value: "same-origin" },
          { key: "X-Frame-Options", value: "SAMEORIGIN" },
          { key: "Permissions-Policy", value: "camera=(self), geolocation=()" },
        ],
      },
    ];
  },
};

export default withNextIntl(nextConfig);
