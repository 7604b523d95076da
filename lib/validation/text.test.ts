// Every string field of every form schema refuses the characters that change how text is shown
// without being seen. Sources: Unicode Standard Annex #9 (the bidirectional embedding, override
// and isolate controls U+202A–U+202E, U+2066–U+2069); CVE-2021-42574 ("Trojan Source") for how
// they disguise text; ISO/IEC 6429 for the C0 controls (BEL U+0007, ESC U+001B) and DEL.
import { readdirSync } from "node:fs";
import path from "node:path";
import { describe, expect, it } from "vitest";
import { z } from "zod";
import { isSafeText, text } from "./text";

type Def = { type: string; shape?: Record<string, z.ZodType>; innerType?: z.ZodType; in?: z.ZodType; out?: z.ZodType; element?: z.ZodType; options?: z.ZodType[]; left?: z.ZodType; right?: z.ZodType; valueType?: z.ZodType };
const defOf = (s: z.ZodType) => (s as unknown as { _zod: { def: Def } })._zod.def;

/** Every string schema inside `s`, with the path of the field it validates. */
function stringLeaves(s: z.ZodType, at: string, out: Array<[string, z.ZodType]>) {
  const d = defOf(s);
  if (d.type === "string") out.push([at, s]);
  else if (d.type === "object") for (const [k, v] of Object.entries(d.shape!)) stringLeaves(v, `${at}.${k}`, out);
  else if (d.type === "pipe") stringLeaves(d.in!, at, out);
  else if (d.type === "array") stringLeaves(d.element!, `${at}[]`, out);
  else if (d.type === "union") d.options!.forEach((o) => stringLeaves(o, at, out));
  else if (d.type === "intersection") [d.left!, d.right!].forEach((side) => stringLeaves(side, at, out));
  else if (d.type === "record") stringLeaves(d.valueType!, `${at}{}`, out);
  else if (d.innerType) stringLeaves(d.innerType, at, out);
}

// Not typed text: a password is a secret compared as sent; an import's file content is checked
// cell by cell (lib/patient-import/row-schema.ts refuses these characters in every cell).
const EXEMPT = new Set(["auth.signInSchema.password", "patient-import.importCheckSchema.content", "patient-import.importRunSchema.content"]);

const BAD = ["\u202E", "\u202A", "\u2066", "\u2069", "\u0007", "\u001B", "\u007F", "\u0000"];

describe("free text refuses bidirectional and control characters", () => {
  it("the shared check refuses each of them and keeps tab, line breaks and ordinary letters", () => {
    for (const c of BAD) expect(isSafeText(`Left${c}right`)).toBe(false);
    expect(isSafeText("Line one\n\tline two\r\nNaïve café, 3 o'clock — ok")).toBe(true);
    const r = text().trim().max(50).safeParse("Bleeding\u202Edesserts");
    expect(r.success).toBe(false);
  });

  it("every string field of every schema in lib/validation refuses them", async () => {
    const dir = import.meta.dirname;
    const problems: string[] = [];
    let fields = 0;
    for (const file of readdirSync(dir).filter((f) => f.endsWith(".ts") && !f.endsWith(".test.ts"))) {
      const mod = (await import(/* @vite-ignore */ path.join(dir, file))) as Record<string, unknown>;
      for (const [name, value] of Object.entries(mod)) {
        if (!(value instanceof z.ZodType)) continue;
        const leaves: Array<[string, z.ZodType]> = [];
        stringLeaves(value, `${file.replace(/\.ts$/, "")}.${name}`, leaves);
        for (const [at, leaf] of leaves) {
          if ([...EXEMPT].some((e) => at.startsWith(e))) continue;
          fields += 1;
          for (const c of BAD) if (leaf.safeParse(`Abc1${c}def`).success) problems.push(`${at} accepts U+${c.charCodeAt(0).toString(16).padStart(4, "0")}`);
        }
      }
    }
    expect(fields).toBeGreaterThan(30);
    expect([...new Set(problems.map((p) => p.split(" ")[0]))]).toEqual([]);
  });
});
