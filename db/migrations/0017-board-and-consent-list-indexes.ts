// Two reads that grow with a clinic group:
// - The day board asks for the visits whose [starts_at, ends_at) overlaps one day. Written as two
//   comparisons on two columns, PostgreSQL multiplies their selectivities and expected thousands of
//   rows where a day holds tens, then chose a parallel plan. As one range overlap on a GiST index
//   of (clinic, visit range), ANALYZE keeps statistics on the range itself and the estimate is right.
//   It replaces the (clinic_id, ends_at, starts_at) index of 0015, which only the board used.
// - The clinic's consent list is read a page at a time, newest first by when the consent was
//   signed (or, unsigned, created), then by id: both keys are in the index, with and without status
//   (the latter replaces consents_clinic_status, its leading part).
import type { MigrationFn } from "umzug";
import type { QueryInterface } from "sequelize";

export const up: MigrationFn<QueryInterface> = async ({ context: qi }) => {
  await qi.sequelize.query(`
    CREATE INDEX appointments_clinic_window ON appointments USING gist (clinic_id, tstzrange(starts_at, ends_at));
    DROP INDEX appointments_clinic_end;
    CREATE INDEX consents_clinic_listed ON consents (clinic_id, (coalesce(signed_at, created_at)), id);
    CREATE INDEX consents_clinic_status_listed ON consents (clinic_id, status, (coalesce(signed_at, created_at)), id);
    DROP INDEX consents_clinic_status;
  `);
};

export const down: MigrationFn<QueryInterface> = async ({ context: qi }) => {
  await qi.sequelize.query(`
    CREATE INDEX consents_clinic_status ON consents (clinic_id, status);
    DROP INDEX consents_clinic_status_listed;
    DROP INDEX consents_clinic_listed;
    CREATE INDEX appointments_clinic_end ON appointments (clinic_id, ends_at, starts_at);
    DROP INDEX appointments_clinic_window;
  `);
};
