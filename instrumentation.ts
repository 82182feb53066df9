// Runs once when the server starts: a production server with missing or local-default secrets
// stops here with the list of what to set, instead of failing later on some request.
export async function register() {
  if (process.env.NEXT_RUNTIME !== "nodejs") return;
  const { env } = await import("./lib/env");
  env();
}
