import { createStudy } from "@/lib/server/studies";
import { scopeOf } from "@/lib/auth/guard";
import { json, readJson, route } from "@/lib/http/route";
import { studySchema } from "@/lib/validation/studies";

export const POST = route({ roles: ["research_nurse", "admin"] }, async ({ req, user, ip }) => {
  const input = await readJson(req, studySchema);
  return json({ study: await createStudy(scopeOf(user), input, ip) }, 201);
});
