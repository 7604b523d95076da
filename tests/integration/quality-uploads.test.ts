// Hostile uploads to POST /api/visits/:visitId/attachments. Needs the S3 fake: scripts/test.sh
// starts it and exports S3_* (for a run by hand: source scripts/lib/fake-s3.sh; start_s3_fake
// PORT DIR). Expected behaviour, OWASP File Upload cheat sheet and ASVS 4.0.3 V12.1.1 (size
// limit), V12.2.1 (type by content, not by the declared type), V12.3.1 (the user-supplied name
// never reaches a storage path): refusals are 4xx JSON (413 for size, 415 for a type that is
// not accepted), never 5xx, and leave neither a row nor an object behind.
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { count, eq } from "drizzle-orm";
import { ListObjectsV2Command, S3Client } from "@aws-sdk/client-s3";
import sharp from "sharp";
import { db } from "@/db/client";
import { attachments, visits } from "@/db/schema";
import { POST as uploadRoute } from "@/app/api/visits/[visitId]/attachments/route";
import { GET as downloadRoute } from "@/app/api/attachments/[attachmentId]/route";
import { actor, ctx, makePatient, makeSite, ORIGIN, type Actor } from "../fixtures/factory";

const s3 = new S3Client({
  endpoint: process.env.S3_ENDPOINT,
  region: process.env.S3_REGION ?? "us-east-1",
  credentials: { accessKeyId: process.env.S3_ACCESS_KEY_ID ?? "", secretAccessKey: process.env.S3_SECRET_ACCESS_KEY ?? "" },
  forcePathStyle: true,
});
const keys = async () => ((await s3.send(new ListObjectsV2Command({ Bucket: process.env.S3_BUCKET! }))).Contents ?? []).map((o) => o.Key!).sort();

let clinician: Actor, visitId: string;
let png: Uint8Array, jpeg: Uint8Array;
const savedLimit = process.env.DENTATE_MAX_UPLOAD_MB;
const enc = (s: string) => new TextEncoder().encode(s);
const cat = (...parts: Uint8Array[]) => {
  const out = new Uint8Array(parts.reduce((n, p) => n + p.byteLength, 0));
  let at = 0;
  for (const p of parts) {
    out.set(p, at);
    at += p.byteLength;
  }
  return out;
};

beforeAll(async () => {
  if (!process.env.S3_ENDPOINT || !process.env.S3_BUCKET) throw new Error("S3_ENDPOINT and S3_BUCKET must be set (scripts/test.sh starts the S3 fake)");
  const site = (await makeSite("U")).id;
  clinician = await actor("clinician", [site]);
  const patient = await makePatient(site);
  const [v] = await db.insert(visits).values({ patientId: patient.id, siteId: site, visitDate: "2026-03-03", examinerId: clinician.userId }).returning();
  visitId = v!.id;
  const img = sharp({ create: { width: 64, height: 48, channels: 3, background: { r: 180, g: 120, b: 110 } } });
  png = new Uint8Array(await img.clone().png().toBuffer());
  jpeg = new Uint8Array(await img.clone().jpeg().toBuffer());
  process.env.DENTATE_MAX_UPLOAD_MB = "1"; // a small limit keeps the oversized case fast
});

afterAll(() => {
  if (savedLimit === undefined) delete process.env.DENTATE_MAX_UPLOAD_MB;
  else process.env.DENTATE_MAX_UPLOAD_MB = savedLimit;
  s3.destroy();
});

async function upload(bytes: Uint8Array, name: string, type: string, extraHeaders: Record<string, string> = {}) {
  const form = new FormData();
  form.set("file", new File([new Uint8Array(bytes)], name, { type }));
  const r = new Request(`${ORIGIN}/api/visits/${visitId}/attachments`, { method: "POST", body: form, headers: { cookie: clinician.cookie, origin: ORIGIN, host: "dentate.test", ...extraHeaders } });
  const res = await uploadRoute(r, ctx({ visitId }));
  return { status: res.status, body: await res.json() };
}

async function rows() {
  const [r] = await db.select({ n: count() }).from(attachments).where(eq(attachments.visitId, visitId));
  return r!.n;
}

async function expectRefused(status: number, bytes: Uint8Array, name: string, type: string) {
  const [n, k] = [await rows(), await keys()];
  const res = await upload(bytes, name, type);
  expect(res.status, `${name}: ${JSON.stringify(res.body)}`).toBe(status);
  expect(typeof res.body.error.message).toBe("string");
  expect(await rows()).toBe(n);
  expect(await keys()).toEqual(k);
}

describe("hostile uploads", () => {
  it("refuses a file over the limit with 413, by stream and by declared length", async () => {
    const big = cat(jpeg, new Uint8Array(1.2 * 1024 * 1024));
    await expectRefused(413, big, "big.jpg", "image/jpeg");
    const res = await upload(png, "x.png", "image/png", { "content-length": String(50 * 1024 * 1024) });
    expect(res.status).toBe(413);
  });

  it("refuses types that are not accepted (415) whatever they claim to be", async () => {
    await expectRefused(415, enc("GIF89a\x01\x00\x01\x00\x00\x00\x00;"), "pic.gif", "image/gif");
    await expectRefused(415, enc("<!doctype html><script>alert(1)</script>"), "photo.png", "image/png");
    await expectRefused(415, enc("<svg xmlns='http://www.w3.org/2000/svg' onload='alert(1)'/>"), "map.svg", "image/svg+xml");
    await expectRefused(415, cat(enc("PK\x03\x04"), new Uint8Array(200)), "report.pdf", "application/pdf");
    await expectRefused(415, enc("MZ\x90\x00 not a photo"), "scan.jpg", "image/jpeg");
  });

  it("never stores script from a JPEG-header + HTML polyglot, nor answers 5xx", async () => {
    const [n, k] = [await rows(), await keys()];
    const polyglot = cat(jpeg.slice(0, 20), enc("<html><script>alert(document.cookie)</script></html>"));
    const res = await upload(polyglot, "x.html", "text/html");
    expect(res.status).toBeGreaterThanOrEqual(400);
    expect(res.status).toBeLessThan(500);
    expect(await rows()).toBe(n);
    expect(await keys()).toEqual(k);
  });

  it("answers a PDF + ZIP polyglot with a 4xx or stores it as a PDF served as an attachment; never 5xx", async () => {
    const pdfZip = cat(enc("%PDF-1.4\n1 0 obj<<>>endobj\ntrailer<<>>\n%%EOF\n"), enc("PK\x03\x04"), new Uint8Array(64));
    const res = await upload(pdfZip, "notes.pdf", "application/zip");
    expect(res.status).toBeLessThan(500);
    if (res.status === 201) {
      expect(res.body.attachment.contentType).toBe("application/pdf");
      const dl = await downloadRoute(new Request(`${ORIGIN}/api/attachments/${res.body.attachment.id}`, { headers: { cookie: clinician.cookie, host: "dentate.test" } }), ctx({ attachmentId: res.body.attachment.id }));
      expect(dl.headers.get("content-type")).toMatch(/^application\/pdf/);
      expect(dl.headers.get("x-content-type-options")).toBe("nosniff");
    } else expect(res.body.error.message).toEqual(expect.any(String));
  });

  it("types a real image by its bytes, not by its declared type or name", async () => {
    const res = await upload(png, "invoice.html", "text/html");
    expect(res.status).toBe(201);
    expect(res.body.attachment.contentType).toBe("image/png");
  });

  it("keeps path tricks in names out of the storage key", async () => {
    for (const name of ["../../etc/passwd", "..\\..\\windows\\win.ini", "a\u0000b.jpg", "%2e%2e%2fsecret.jpg", "ﷺ🧪.jpg", "n".repeat(5000) + ".jpg"]) {
      const res = await upload(jpeg, name, "image/jpeg");
      expect(res.status, name.slice(0, 40)).toBe(201);
      const [row] = await db.select({ objectKey: attachments.objectKey, thumbKey: attachments.thumbKey }).from(attachments).where(eq(attachments.id, res.body.attachment.id));
      for (const key of [row!.objectKey, row!.thumbKey ?? ""]) {
        expect(key).not.toMatch(/\.\.|\\|\u0000|passwd|win\.ini|secret|nnnn/);
        expect(key).toMatch(/^[A-Za-z0-9/_.-]*$/);
      }
    }
  });
});
