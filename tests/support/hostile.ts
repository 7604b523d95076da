// Hostile values for fuzzing the routes: values of the wrong type for a field, boundary values
// of the right type, and whole bodies no schema can accept. JSON has no NaN or Infinity, so the
// numeric extremes are the largest doubles, negative zero and integers past 2^53.
import fc from "fast-check";

const LONG = "x".repeat(10_000);
export const OVERSIZED_BYTES = 300 * 1024; // over the 256 KB JSON limit in lib/http/route.ts

export const BOUNDARY_STRINGS = [
    "", " ", LONG, "\u0000", "a\u0000b", "\ud800", "\u202eevil", "ﷺ🧪👩🏽‍⚕️", "Ω≈ç√∫", "../../etc/passwd", "<script>alert(1)</script>",
    "'; drop table patients; --", "2026-02-30", "2026-13-01", "0000-00-00", "99999-01-01", "1e308", "NaN", "null", "true", "{}", "[]",
    "00000000-0000-0000-0000-000000000000", "ffffffff-ffff-ffff-ffff-ffffffffffff",
];
export const BOUNDARY_NUMBERS = [1e308, -1e308, -0, 0, -1, 1, 2 ** 31, -(2 ** 31) - 1, 2 ** 53 + 2, -(2 ** 53) - 2, 5e-324, 0.1, 12, 11.999999999999, 100000];

export const hostileStrings = fc.oneof(
  fc.constantFrom(...BOUNDARY_STRINGS),
  fc.string({ unit: "grapheme", maxLength: 40 }),
  fc.string({ unit: "binary", maxLength: 40 }),
);

export const hostileNumbers = fc.oneof(
  fc.constantFrom(...BOUNDARY_NUMBERS),
  fc.double({ noNaN: true, noDefaultInfinity: true }),
  fc.integer(),
);

const nested = fc.letrec((tie) => ({
  node: fc.oneof({ depthSize: "small" }, fc.jsonValue({ maxDepth: 2 }), fc.array(tie("node"), { maxLength: 3 }), fc.dictionary(fc.string({ maxLength: 8 }), tie("node"), { maxKeys: 3 })),
})).node;

/** A value whose JSON type differs from the example's, so it can never satisfy the field. */
export function wrongTypeFor(example: unknown): fc.Arbitrary<unknown> {
  const objects = fc.dictionary(fc.string({ maxLength: 8 }), fc.jsonValue({ maxDepth: 2 }), { minKeys: 0, maxKeys: 4 });
  const arrays = fc.array(fc.jsonValue({ maxDepth: 2 }), { maxLength: 4 });
  const options: fc.Arbitrary<unknown>[] = [fc.constant(null)];
  if (typeof example !== "string") options.push(hostileStrings);
  if (typeof example !== "number") options.push(hostileNumbers);
  if (typeof example !== "boolean") options.push(fc.boolean());
  if (!Array.isArray(example)) options.push(arrays);
  if (example === null || typeof example !== "object" || Array.isArray(example)) options.push(objects);
  return fc.oneof(...options);
}

/** A value of the example's own type at its edges (may or may not be acceptable). */
export function boundaryFor(example: unknown): fc.Arbitrary<unknown> {
  if (typeof example === "number") return hostileNumbers;
  if (typeof example === "string") return hostileStrings;
  if (Array.isArray(example)) return fc.oneof(fc.constant([]), fc.array(fc.jsonValue({ maxDepth: 2 }), { maxLength: 50 }), fc.constant(Array.from({ length: 5000 }, () => example[0] ?? 0)));
  if (example && typeof example === "object") return fc.oneof(fc.constant({}), nested);
  return fc.oneof(hostileStrings, hostileNumbers, fc.constant(null));
}

/** Raw request bodies (text) that are not an acceptable JSON object at all. */
export const hostileRawBodies: fc.Arbitrary<string> = fc.oneof(
  fc.constantFrom("", "{", "{\"a\":", "nul", "undefined", "NaN", "Infinity", "[1,2", "\u0000", "{\"__proto__\":{\"admin\":true}}", "[]", "null", "0", "-0", "\"\"", "true"),
  fc.constant("[".repeat(5000) + "]".repeat(5000)),
  fc.constant(JSON.stringify({ x: "y".repeat(OVERSIZED_BYTES) })),
  fc.constant(" ".repeat(OVERSIZED_BYTES) + "{}"),
  fc.jsonValue({ maxDepth: 3 }).filter((v) => v === null || typeof v !== "object" || Array.isArray(v)).map((v) => JSON.stringify(v)),
  fc.string({ unit: "binary", maxLength: 60 }).filter((s) => {
    try {
      const v = JSON.parse(s);
      return v === null || typeof v !== "object";
    } catch {
      return true;
    }
  }),
);
