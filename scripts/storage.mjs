// Local S3-compatible storage fake (s3rver) on loopback, with the documents bucket created.
import S3rver from "s3rver";

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
