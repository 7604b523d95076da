import { describe, expect, it } from "vitest";
import type { FieldError, FieldErrors } from "react-hook-form";
import { lesionFieldsSchema } from "@/lib/validation/lesions";
import { studySchema } from "@/lib/validation/studies";
import { plainResolver } from "./plain-resolver";

// Client forms show the words the server answers with (lib/validation/plain-words.ts), never the
// validation library's own ("Too big: expected array to have <=3 items"), for any check a schema
// does not word itself.
const opts = { fields: {}, shouldUseNativeValidation: false } as const;
const message = (errors: FieldErrors, name: string) => (errors[name] as FieldError | undefined)?.message;

describe("plainResolver", () => {
  it("words a lesion's vessel list that is too long as the server does", async () => {
    const lesion = { clockStartH: 1, clockEndH: 2, distanceStartCm: 1, distanceEndCm: 2, grade: "lsil", vessels: ["punctation", "mosaic", "atypical", "mosaic"] };
    const r = await plainResolver(lesionFieldsSchema)(lesion as never, undefined, opts);
    expect(message(r.errors, "vessels")).toBe("Choose at most 3.");
  });

  it("words a missing study field as the server does, and keeps the schema's own words", async () => {
    const r = await plainResolver(studySchema)({ code: "x", siteIds: [] } as never, undefined, opts);
    expect(message(r.errors, "title")).toBe("Required.");
    expect(message(r.errors, "code")).toBe("A study code is 2 to 24 letters, digits or dashes.");
    expect(message(r.errors, "siteIds")).toBe("Choose at least one site.");
  });
});
