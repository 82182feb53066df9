// The background worker's entry point, compiled to .data/build/worker.cjs (`buildWorker` in
// scripts/lib.mjs) and run with plain `node` by `npm run demo` and `npm test`. React's production
// build renders the e-mail templates several times faster, so it is chosen before anything loads
// React; then the worker loop starts.
Object.assign(process.env, { NODE_ENV: process.env.NODE_ENV ?? "production" });
void import("./mail-worker");
