import "server-only";
import type { UserRecord } from "@/db/queries/users";

/** What the API returns about a user: never the password hash. */
export function publicUser(u: Pick<UserRecord, "id" | "email" | "name"> & ({ emailVerifiedAt: number | null } | { emailVerified: boolean })) {
  const emailVerified = "emailVerified" in u ? u.emailVerified : u.emailVerifiedAt !== null;
  return { id: u.id, email: u.email, name: u.name, emailVerified };
}
