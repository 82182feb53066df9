// Imported first by the migrator and the seed: they connect as the role that owns the tables
// (OWNER_DATABASE_URL), while the app and the worker use DATABASE_URL, a role that owns nothing.
// Without OWNER_DATABASE_URL both use DATABASE_URL, as on a server with a single role.
if (process.env.OWNER_DATABASE_URL) process.env.DATABASE_URL = process.env.OWNER_DATABASE_URL;

export {};
