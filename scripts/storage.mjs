// Local S3-compatible storage fake (s3rver) on loopback, with the documents bucket created.
import S3rver from "s3rver";
import account from "s3rver/lib/models/account.js";

// Accept our own keys instead of the fake's published ones (S3RVER/S3RVER), so the app runs with
// the same kind of settings as in production.
if (process.env.S3_ACCESS_KEY_ID && process.env.S3_SECRET_ACCESS_KEY) {
  account.DUMMY_ACCOUNT.revokeAccessKey("S3RVER");
  account.DUMMY_ACCOUNT.createKeyPair(process.env.S3_ACCESS_KEY_ID, process.env.S3_SECRET_ACCESS_KEY);
}

const port = Number(process.env.S3_PORT ?? 4569);
const server = new S3rver({
  port,
  address: "127.0.0.1",
  directory: process.env.S3_DIR,
  silent: true,
  configureBuckets: [{ name: process.env.S3_BUCKET ?? "cuspal-documents" }],
});
await server.run();
console.log(`storage fake listening on 127.0.0.1:${port}`);
const stop = async () => {
  await server.close();
  process.exit(0);
};
process.on("SIGTERM", stop);
process.on("SIGINT", stop);
