import { describe, expect, it } from "vitest";
import { createHash } from "node:crypto";
import sharp from "sharp";
import exifr from "exifr";
import { prepareUpload, THUMB_WIDTH_PX } from "./prepare";

const MB = 1024 * 1024;

// An invented photograph carrying a GPS position, camera make and a date, as a phone would write.
async function photoWithGps(width = 640, height = 480): Promise<Uint8Array> {
  const buf = await sharp({ create: { width, height, channels: 3, background: { r: 200, g: 120, b: 110 } } })
    .jpeg()
    .withExif({
      IFD0: { Make: "InventedCam", Model: "Scope 1", DateTime: "2025:03:04 10:11:12" },
      IFD3: { GPSLatitudeRef: "N", GPSLatitude: "48/1 51/1 30/1", GPSLongitudeRef: "E", GPSLongitude: "2/1 21/1 0/1" },
    })
    .toBuffer();
  return new Uint8Array(buf);
}

describe("prepareUpload", () => {
  it("stores a JPEG without its GPS position, device or dates", async () => {
    const input = await photoWithGps();
    // The input really carries them (exifr reads EXIF as specified by CIPA DC-008 / JEITA Exif 2.3).
    expect(await exifr.gps(input)).toMatchObject({ latitude: expect.closeTo(48.8583, 3), longitude: expect.closeTo(2.35, 3) });
    const r = await prepareUpload(input, 15 * MB);
    if (!r.ok) throw new Error(r.refusal.message);
    expect(r.upload.mime).toBe("image/jpeg");
    expect(await exifr.parse(r.upload.bytes, true)).toBeUndefined();
    expect(await exifr.gps(r.upload.bytes)).toBeUndefined();
  });

  it("applies the EXIF orientation before dropping it, so the picture stays upright", async () => {
    // Orientation 6 = rotate 90° clockwise to display (Exif 2.3 §4.6.4, tag 0x0112).
    const sideways = await sharp({ create: { width: 60, height: 20, channels: 3, background: "#888" } })
      .jpeg()
      .withMetadata({ orientation: 6 })
      .toBuffer();
    expect((await sharp(sideways).metadata()).orientation).toBe(6);
    const r = await prepareUpload(new Uint8Array(sideways), 15 * MB);
    if (!r.ok) throw new Error(r.refusal.message);
    const meta = await sharp(r.upload.bytes).metadata();
    expect([meta.width, meta.height]).toEqual([20, 60]);
  });

  it("makes a WebP thumbnail no wider than the thumbnail size", async () => {
    const r = await prepareUpload(await photoWithGps(1200, 900), 15 * MB);
    if (!r.ok || !r.upload.thumb) throw new Error("no thumbnail");
    const meta = await sharp(r.upload.thumb).metadata();
    expect(meta.format).toBe("webp");
    expect(meta.width).toBe(THUMB_WIDTH_PX);
    expect(meta.height).toBe(240); // 320 × 900/1200, aspect kept
  });

  it("checksums the stored bytes with SHA-256 (FIPS 180-4, as node:crypto computes it)", async () => {
    const r = await prepareUpload(await photoWithGps(), 15 * MB);
    if (!r.ok) throw new Error(r.refusal.message);
    expect(r.upload.sha256).toBe(createHash("sha256").update(r.upload.bytes).digest("hex"));
    expect(r.upload.sha256).toMatch(/^[0-9a-f]{64}$/);
  });

  it("keeps a PDF as it came and makes no thumbnail", async () => {
    const pdf = new TextEncoder().encode("%PDF-1.4\n1 0 obj\n<< /Type /Catalog >>\nendobj\n%%EOF\n");
    const r = await prepareUpload(pdf, 15 * MB);
    if (!r.ok) throw new Error(r.refusal.message);
    expect(r.upload.kind).toBe("document");
    expect(Array.from(r.upload.bytes)).toEqual(Array.from(pdf));
    expect(r.upload.thumb).toBeNull();
  });

  it("refuses a file over the limit, and content that is not accepted", async () => {
    const big = await prepareUpload(new Uint8Array(2 * MB + 1), 2 * MB);
    expect(big).toMatchObject({ ok: false, refusal: { reason: "too_large" } });
    const html = await prepareUpload(new TextEncoder().encode("<html><body>hi</body></html>"), 2 * MB);
    expect(html).toMatchObject({ ok: false, refusal: { reason: "unsupported_type" } });
  });

  it("refuses a damaged JPEG that only has the right first bytes", async () => {
    const bytes = new Uint8Array(4096);
    bytes.set([0xff, 0xd8, 0xff, 0xe0]);
    const r = await prepareUpload(bytes, 15 * MB);
    expect(r.ok).toBe(false);
  });
});
