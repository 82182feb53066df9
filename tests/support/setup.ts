// Integration tests share one PostgreSQL database; close the pool after each test file.
import { afterAll } from "vitest";

afterAll(async () => {
  if (globalThis.__cuspalSequelize) await globalThis.__cuspalSequelize.close().catch(() => undefined);
  globalThis.__cuspalSequelize = undefined;
});
