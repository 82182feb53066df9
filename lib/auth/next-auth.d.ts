import type { Role } from "@/db/models/user";

declare module "next-auth" {
  interface Session {
    user: {
      id: string;
      email: string;
      name: string | null;
      role: Role;
      clinicId: string | null;
      /** Staff whose clinic requires two-factor sign-in and who have not set it up yet. */
      setupTwoFactor?: boolean;
    };
  }
  interface User {
    role?: Role;
    clinicId?: string | null;
  }
}

declare module "next-auth/jwt" {
  interface JWT {
    role?: Role;
    clinicId?: string | null;
    /** The account's session version when this session began. */
    sv?: number;
    /** When the person signed in (seconds since 1970), for the absolute lifetime. */
    authAt?: number;
    setupTwoFactor?: boolean;
  }
}
