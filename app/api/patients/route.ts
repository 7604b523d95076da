import { z } from "zod";
import { listPatients } from "@/db/queries/patients";
import { scopeOf } from "@/lib/auth/guard";
import { json, readJson, readQuery, route } from "@/lib/http/route";
import { registerPatient } from "@/lib/server/patients";
import { recordAudit } from "@/lib/server/audit";
import { registerPatientSchema } from "@/lib/validation/patients";

const query = z.object({
  q: z.string().max(100, "Search text is too long.").optional(),
  page: z.coerce.number({ message: "Page must be a number." }).int().min(1).max(10_000).optional(),
});

export const GET = route({ roles: ["clinician", "reviewer", "admin"] }, async ({ req, user, ip }) => {
  const { q, page } = readQuery(req, query);
  const list = await listPatients(scopeOf(user), { q, page });
  // One row per request (with the search typed), not one per patient listed.
  await recordAudit({ userId: user.id, ip, action: q ? "patient.search" : "patient.list", detail: { q: q ?? null, page: page ?? 1 } });
  return list;
});

/** Registers a patient: 201; 409 `mrn_taken` naming the holder; 409 `possible_duplicate` until confirmed. */
export const POST = route({ roles: ["clinician", "admin"] }, async ({ req, user, ip }) => {
  const input = await readJson(req, registerPatientSchema);
  const result = await registerPatient(user, input, ip);
  switch (result.kind) {
    case "created":
      return json({ patient: result.patient, href: `/patients/${result.patient.id}` }, 201);
    case "mrn_taken":
      return json({
        error: {
          code: "mrn_taken",
          message: `This record number is already registered at this site, for ${result.existing.familyName}, ${result.existing.givenName}.`,
          fields: { mrn: ["Already registered at this site."] },
          existing: { id: result.existing.id, href: `/patients/${result.existing.id}` },
        },
      }, 409);
    case "possible_duplicate":
      return json({
        error: {
          code: "possible_duplicate",
          message: "A patient born the same day with the same or a similar family name is already registered here. Check they are not the same person, then confirm.",
          candidates: result.candidates.map((c) => ({ ...c, href: `/patients/${c.id}` })),
        },
      }, 409);
  }
});
