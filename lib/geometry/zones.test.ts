import { describe, expect, it } from "vitest";
import { ZONES } from "@/lib/domain/vocab";
import { DEFAULT_ZONE_BOUNDS, validateZoneBounds, zoneBands, zoneBoundsSchema, zoneForDistance } from "./zones";

describe("zoneForDistance with the default bounds", () => {
  // Perianal skin = within a 5 cm radius of the verge (AJCC Cancer Staging Manual 8th ed., anus chapter).
  it("puts skin up to 5 cm outside the verge in the perianal zone, boundary included", () => {
    expect(zoneForDistance(-4.9)).toBe("perianal");
    expect(zoneForDistance(-5)).toBe("perianal");
    expect(zoneForDistance(-0.1)).toBe("perianal");
    expect(zoneForDistance(-5.1)).toBeNull();
  });
  // Dentate line 1–2 cm above the verge (HP:0030440): both ends of that range fall in the
  // transformation zone, which runs from the dentate line up about 1 cm (Fenger C.).
  it("puts the whole published dentate-line range in the transformation zone", () => {
    expect(zoneForDistance(1)).toBe("transformation_zone");
    expect(zoneForDistance(2)).toBe("transformation_zone");
  });
  it("puts the verge itself in the canal, not on the skin", () => {
    expect(zoneForDistance(0)).toBe("distal_canal");
    expect(zoneForDistance(0.5)).toBe("distal_canal");
  });
  // Surgical canal about 4 cm (Sleisenger & Fordtran); above it, the rectum.
  it("places 3 cm in the proximal canal and 5 cm in the distal rectum", () => {
    expect(zoneForDistance(3)).toBe("proximal_canal");
    expect(zoneForDistance(5)).toBe("distal_rectum");
    expect(zoneForDistance(8)).toBe("distal_rectum");
    expect(zoneForDistance(8.5)).toBeNull();
    expect(zoneForDistance(Number.NaN)).toBeNull();
  });
  it("follows configured bounds", () => {
    const bounds = { ...DEFAULT_ZONE_BOUNDS, dentateLineCm: 2.5, canalLengthCm: 5 };
    expect(zoneForDistance(1.5, bounds)).toBe("distal_canal");
    expect(zoneForDistance(4.5, bounds)).toBe("proximal_canal");
  });
});

describe("zoneBands", () => {
  it("lists every vocabulary zone once, outermost first, each band starting where the last ends", () => {
    const bands = zoneBands();
    expect(bands.map((b) => b.zone)).toEqual([...ZONES]);
    expect(bands[0].fromCm).toBe(-5); // AJCC 8th: 5 cm perianal radius
    for (let i = 1; i < bands.length; i++) expect(bands[i].fromCm).toBe(bands[i - 1].toCm);
    for (const b of bands) expect(b.toCm).toBeGreaterThan(b.fromCm);
  });
});

describe("validateZoneBounds and zoneBoundsSchema", () => {
  it("accepts the defaults", () => {
    expect(validateZoneBounds(DEFAULT_ZONE_BOUNDS)).toEqual([]);
    expect(zoneBoundsSchema.safeParse(DEFAULT_ZONE_BOUNDS).success).toBe(true);
  });
  it("rejects a canal that ends below the transformation zone", () => {
    const errors = validateZoneBounds({ ...DEFAULT_ZONE_BOUNDS, canalLengthCm: 2 });
    expect(errors.map((e) => e.field)).toEqual(["canalLengthCm"]);
  });
  it("rejects a transformation zone reaching below the verge and a rectum below the canal", () => {
    const errors = validateZoneBounds({
      ...DEFAULT_ZONE_BOUNDS,
      transformationZoneBelowCm: 2,
      rectumUpToCm: 3,
    });
    expect(errors.map((e) => e.field).sort()).toEqual(["rectumUpToCm", "transformationZoneBelowCm"]);
  });
  it("rejects zero or negative widths", () => {
    expect(validateZoneBounds({ ...DEFAULT_ZONE_BOUNDS, perianalOuterCm: 0 })[0].field).toBe("perianalOuterCm");
  });
  it("reports schema issues on the offending field with a message", () => {
    const result = zoneBoundsSchema.safeParse({ ...DEFAULT_ZONE_BOUNDS, rectumUpToCm: 4, dentateLineCm: "x" });
    expect(result.success).toBe(false);
    if (!result.success) {
      const paths = result.error.issues.map((i) => i.path.join("."));
      expect(paths).toContain("dentateLineCm");
      expect(result.error.issues.every((i) => i.message.length > 0)).toBe(true);
    }
    const ordered = zoneBoundsSchema.safeParse({ ...DEFAULT_ZONE_BOUNDS, rectumUpToCm: 4 });
    expect(ordered.success).toBe(false);
    if (!ordered.success) expect(ordered.error.issues[0].path).toEqual(["rectumUpToCm"]);
  });
});
