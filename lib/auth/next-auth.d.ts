import type { Role } from "@/db/models/user";

declare module "next-auth" {
  interface Session {
    user: { id: string; email: string; name: string | null; role: Role; clinicId: string | null };
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
  }
}
