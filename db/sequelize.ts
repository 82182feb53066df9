// The one Sequelize instance, shared by the app, the worker, the scripts and the tests.
// Creating it does not connect, so importing models at build time needs no database.
import pg from "pg";
import { Sequelize } from "sequelize";

declare global {
  var __cuspalSequelize: Sequelize | undefined;
}

function create(): Sequelize {
  const instance = new Sequelize(process.env.DATABASE_URL || "postgres://not-configured@127.0.0.1:1/none", {
    dialect: "postgres",
    dialectModule: pg,
    logging: process.env.SQL_LOG === "1" ? console.log : false,
    define: { underscored: true },
    pool: { max: Number(process.env.DB_POOL_MAX ?? 10), idle: 10_000 },
  });
  instance.addHook("beforeConnect", () => {
    if (!process.env.DATABASE_URL) {
      throw new Error("DATABASE_URL is not set: start Cuspal with `npm run demo`, or set it to a PostgreSQL URL.");
    }
  });
  return instance;
}

// Kept on globalThis so hot reloads in development reuse one pool.
export const sequelize: Sequelize = (globalThis.__cuspalSequelize ??= create());
