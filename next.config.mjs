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
