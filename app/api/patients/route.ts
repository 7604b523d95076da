import { z } from "zod";
import { listPatients } from "@/db/queries/patients";
import { scopeOf } from "@/lib/auth/guard";
import { readQuery, route } from "@/lib/http/route";

const query = z.object({
  q: z.string().max(100, "Search text is too long.").optional(),
  page: z.coerce.number({ message: "Page must be a number." }).int().min(1).max(10_000).optional(),
});

export const GET = route({ roles: ["clinician", "reviewer", "admin"] }, async ({ req, user }) => {
  const { q, page } = readQuery(req, query);
  return listPatients(scopeOf(user), { q, page });
});
