// The direct read path against the real PostgreSQL: the same values Sequelize's own raw queries
// give, the caller's transaction respected, and bad input still a 400.
import { QueryTypes } from "sequelize";
import { describe, expect, it } from "vitest";
import { sequelize } from "@/db/models";
import { selectRows } from "@/db/select-rows";
import { fromDatabaseError } from "@/lib/server/db-errors";

const SQL = `SELECT now()::timestamptz AS at, 9007199254740993::bigint AS big, '{"a":1}'::jsonb AS doc, ARRAY['x','y'] AS list, tstzrange('2027-03-01T09:00:00Z', '2027-03-01T10:00:00Z') AS span, true AS yes`;

describe("selectRows", () => {
  it("parses values as Sequelize's raw queries do (the reference: the same SQL through sequelize.query)", async () => {
    const [ours] = await selectRows<Record<string, unknown>>(SQL, []);
    const [theirs] = await sequelize.query<Record<string, unknown>>(SQL, { type: QueryTypes.SELECT });
    expect(Object.keys(ours)).toEqual(Object.keys(theirs));
    for (const key of Object.keys(theirs)) {
      if (key === "at") continue; // now() differs between two statements
      expect(ours[key], key).toEqual(theirs[key]);
    }
    expect(ours.at).toBeInstanceOf(Date);
    // A bigint beyond 2^53 must not lose digits.
    expect(ours.big).toBe("9007199254740993");
  });

  it("takes positional parameters, arrays included", async () => {
    const rows = await selectRows<{ n: number }>(`SELECT n FROM unnest($1::int[]) AS n WHERE n > $2 ORDER BY n`, [[1, 5, 9, 3], 2]);
    expect(rows.map((r) => r.n)).toEqual([3, 5, 9]);
  });

  it("reads inside the caller's transaction, seeing its own uncommitted writes", async () => {
    await sequelize.transaction(async (transaction) => {
      await sequelize.query(`CREATE TEMP TABLE select_rows_tx (v int) ON COMMIT DROP`, { transaction });
      await sequelize.query(`INSERT INTO select_rows_tx VALUES (7)`, { transaction });
      expect(await selectRows<{ v: number }>(`SELECT v FROM select_rows_tx`, [], transaction)).toEqual([{ v: 7 }]);
    });
  });

  it("turns PostgreSQL's refusal of a bad value into Sequelize's DatabaseError, which the API answers with 400", async () => {
    const err = await selectRows(`SELECT $1::uuid AS id`, ["not-a-uuid"]).catch((e: unknown) => e);
    const mapped = fromDatabaseError(err);
    // [P] PostgreSQL Appendix A: 22P02 invalid_text_representation (class 22, data exception).
    expect((err as { parent?: { code?: string } }).parent?.code).toBe("22P02");
    expect(mapped?.status).toBe(400);
  });
});
