// Password hashing with bcryptjs (pure JavaScript bcrypt).
import bcrypt from "bcryptjs";

const COST = 10;

export const hashPassword = (plain: string) => bcrypt.hash(plain, COST);
export const verifyPassword = (plain: string, hash: string) => bcrypt.compare(plain, hash);
// Compared against when the e-mail is unknown, so both cases take the same time.
export const DUMMY_HASH = "$2b$10$Xv9f7mzoqN/CMzd7yEChje9d6.bzHfKFIX42ooG/1vhzKyLFqKVGS";
