// The benchmark's write floor (npm run bench): what a signed-in write pays before its own work.
// The session check (route()), the Origin check of a mutation, a lesion-sized JSON body read and
// validated with the lesion form's schema, then BEGIN; SELECT 1; COMMIT. It reads and changes no
// record. Not linked from the app; listed in tests/support/route-requests.ts as the bench's route.
import { transactionFloor } from "@/lib/server/bench-floor";
import { readJson, route } from "@/lib/http/route";
import { createLesionSchema } from "@/lib/validation/lesions";

export const POST = route({ roles: "any" }, async ({ req }) => {
  await readJson(req, createLesionSchema);
  await transactionFloor();
  return { ok: true };
});
