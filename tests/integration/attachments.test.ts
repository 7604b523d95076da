// Photographs and documents: type by content, metadata stripped, nothing orphaned, guarded
// downloads. Needs the database and the S3 fake that scripts/test.sh starts (S3_* variables).
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { and, count, eq } from "drizzle-orm";
import { ListObjectsV2Command, S3Client } from "@aws-sdk/client-s3";
import sharp from "sharp";
import exifr from "exifr";
import { db } from "@/db/client";
import { addenda, attachments, auditEvents, lesions, visits } from "@/db/schema";
import { GET as listRoute, POST as uploadRoute } from "@/app/api/visits/[visitId]/attachments/route";
import { DELETE as deleteRoute, GET as downloadRoute } from "@/app/api/attachments/[attachmentId]/route";
import { actor, ctx, makePatient, makeSite, ORIGIN, type Actor } from "../fixtures/factory";

const s3 = new S3Client({
  endpoint: process.env.S3_ENDPOINT,
  region: process.env.S3_REGION ?? "us-east-1",
  credentials: { accessKeyId: process.env.S3_ACCESS_KEY_ID ?? "", secretAccessKey: process.env.S3_SECRET_ACCESS_KEY ?? "" },
  forcePathStyle: true,
});

async function bucketKeys(): Promise<string[]> {
  const out = await s3.send(new ListObjectsV2Command({ Bucket: process.env.S3_BUCKET! }));
  return (out.Contents ?? []).map((o) => o.Key!).sort();
}

let siteA: string, siteB: string, visitA: string, visitB: string, lesionA: string, lesionB: string;
let clinician: Actor, reviewer: Actor, nurse: Actor, otherClinician: Actor;

async function makeVisit(siteId: string, examinerId: string) {
  const patient = await makePatient(siteId);
  const [v] = await db.insert(visits).values({ patientId: patient.id, siteId, visitDate: "2026-03-02", examinerId }).returning({ id: visits.id });
  const [l] = await db
    .insert(lesions)
    .values({ visitId: v!.id, siteId, label: "L1", clockStartH: 1, clockEndH: 3, distanceStartCm: 1, distanceEndCm: 2, zone: "transformation_zone", grade: "hsil" })
    .returning({ id: lesions.id });
  return { visitId: v!.id, lesionId: l!.id };
}

function upload(who: Actor, visitId: string, bytes: Uint8Array, name: string, type: string, fields: Record<string, string> = {}) {
  const form = new FormData();
  form.set("file", new File([new Uint8Array(bytes)], name, { type }));
  for (const [k, v] of Object.entries(fields)) form.set(k, v);
  const r = new Request(`${ORIGIN}/api/visits/${visitId}/attachments`, { method: "POST", body: form, headers: { cookie: who.cookie, origin: ORIGIN, host: "dentate.test" } });
  return uploadRoute(r, ctx({ visitId }));
}

function get(who: Actor, path: string) {
  return new Request(`${ORIGIN}${path}`, { headers: { cookie: who.cookie, host: "dentate.test" } });
}

async function rowsFor(visitId: string) {
  const [r] = await db.select({ n: count() }).from(attachments).where(eq(attachments.visitId, visitId));
  return r!.n;
}

// An invented photograph with a GPS position and camera details, as a phone writes them.
async function jpegWithGps(): Promise<Uint8Array> {
  const buf = await sharp({ create: { width: 800, height: 600, channels: 3, background: { r: 190, g: 110, b: 100 } } })
    .jpeg()
    .withExif({
      IFD0: { Make: "InventedCam", Model: "Scope 1", DateTime: "2025:03:04 10:11:12" },
      IFD3: { GPSLatitudeRef: "N", GPSLatitude: "48/1 51/1 30/1", GPSLongitudeRef: "E", GPSLongitude: "2/1 21/1 0/1" },
    })
    .toBuffer();
  return new Uint8Array(buf);
}

beforeAll(async () => {
  if (!process.env.S3_ENDPOINT || !process.env.S3_BUCKET) throw new Error("S3_ENDPOINT and S3_BUCKET must be set (scripts/test.sh starts the S3 fake)");
  siteA = (await makeSite("A")).id;
  siteB = (await makeSite("B")).id;
  clinician = await actor("clinician", [siteA]);
  reviewer = await actor("reviewer", [siteA]);
  nurse = await actor("research_nurse", [siteA]);
  otherClinician = await actor("clinician", [siteB]);
  ({ visitId: visitA, lesionId: lesionA } = await makeVisit(siteA, clinician.userId));
  ({ visitId: visitB, lesionId: lesionB } = await makeVisit(siteB, otherClinician.userId));
});

afterAll(() => s3.destroy());

describe("uploads are judged by their bytes", () => {
  const html = new TextEncoder().encode("<!DOCTYPE html><html><body><script>document.cookie</script></body></html>");
  const elf = new Uint8Array(4096);
  elf.set([0x7f, 0x45, 0x4c, 0x46, 2, 1, 1, 0]); // ELF magic (System V ABI, ELF header e_ident)
  const pe = new Uint8Array(4096);
  pe.set([0x4d, 0x5a]); // "MZ" DOS stub (Microsoft PE/COFF specification)
  pe.set([0x80, 0, 0, 0], 0x3c);
  pe.set([0x50, 0x45, 0, 0], 0x80);

  for (const [what, bytes] of [["an HTML document", html], ["an ELF program", elf], ["a PE program", pe]] as const) {
    it(`refuses ${what} named .jpg and sent as image/jpeg with 415, storing nothing`, async () => {
      const before = await bucketKeys();
      const rowsBefore = await rowsFor(visitA);
      const res = await upload(clinician, visitA, bytes, "holiday.jpg", "image/jpeg");
      expect(res.status).toBe(415); // RFC 9110 §15.5.16 Unsupported Media Type
      expect((await res.json()).error.code).toBe("unsupported_media");
      expect(await rowsFor(visitA)).toBe(rowsBefore);
      expect(await bucketKeys()).toEqual(before);
    });
  }

  it("refuses a file over the size limit with 413 and stores nothing", async () => {
    const before = await bucketKeys();
    const old = process.env.DENTATE_MAX_UPLOAD_MB;
    process.env.DENTATE_MAX_UPLOAD_MB = "0.01"; // 10 KiB for this test
    try {
      const noisy = await sharp({ create: { width: 400, height: 400, channels: 3, background: "#808080", noise: { type: "gaussian", mean: 128, sigma: 40 } } }).jpeg().toBuffer();
      expect(noisy.byteLength).toBeGreaterThan(10 * 1024);
      const res = await upload(clinician, visitA, new Uint8Array(noisy), "big.jpg", "image/jpeg");
      expect(res.status).toBe(413); // RFC 9110 §15.5.14 Content Too Large
    } finally {
      if (old === undefined) delete process.env.DENTATE_MAX_UPLOAD_MB;
      else process.env.DENTATE_MAX_UPLOAD_MB = old;
    }
    expect(await bucketKeys()).toEqual(before);
  });

  it("answers 404 for another site's visit and stores nothing", async () => {
    const before = await bucketKeys();
    const res = await upload(clinician, visitB, await jpegWithGps(), "a.jpg", "image/jpeg");
    expect(res.status).toBe(404);
    expect(await rowsFor(visitB)).toBe(0);
    expect(await bucketKeys()).toEqual(before);
  });

  it("answers 400 for a lesion that is not part of the visit, storing nothing", async () => {
    const before = await bucketKeys();
    const res = await upload(clinician, visitA, await jpegWithGps(), "a.jpg", "image/jpeg", { lesionId: lesionB });
    expect(res.status).toBe(400);
    expect((await res.json()).error.fields.lesionId).toBeTruthy();
    const bad = await upload(clinician, visitA, await jpegWithGps(), "a.jpg", "image/jpeg", { lesionId: "not-an-id" });
    expect(bad.status).toBe(400);
    expect(await bucketKeys()).toEqual(before);
  });
});

describe("a photograph with GPS EXIF", () => {
  let attachmentId: string;

  it("is stored under a key that ignores the uploader's file name", async () => {
    const input = await jpegWithGps();
    expect(await exifr.gps(input)).toMatchObject({ latitude: expect.closeTo(48.858, 2) }); // the input does carry GPS
    const res = await upload(clinician, visitA, input, "../../etc/passwd\u0000.jpg", "application/octet-stream", { lesionId: lesionA, caption: "After acetic acid" });
    expect(res.status).toBe(201);
    attachmentId = (await res.json()).attachment.id;
    const [row] = await db.select().from(attachments).where(eq(attachments.id, attachmentId));
    expect(row!.objectKey).toBe(`sites/${siteA}/visits/${visitA}/${attachmentId}.jpg`);
    expect(row!.objectKey).not.toContain("..");
    expect(await bucketKeys()).toEqual(expect.arrayContaining([row!.objectKey, row!.thumbKey]));
  });

  it("comes back from the download route without GPS or any EXIF, with a matching SHA-256", async () => {
    const res = await downloadRoute(get(clinician, `/api/attachments/${attachmentId}`), ctx({ attachmentId }));
    expect(res.status).toBe(200);
    expect(res.headers.get("content-type")).toBe("image/jpeg");
    const body = new Uint8Array(await res.arrayBuffer());
    expect(await exifr.gps(body)).toBeUndefined();
    expect(await exifr.parse(body, true)).toBeUndefined();
    const { createHash } = await import("node:crypto");
    expect(createHash("sha256").update(body).digest("hex")).toBe(res.headers.get("x-dentate-sha256"));
  });

  it("serves a WebP thumbnail at most 320 px wide", async () => {
    const res = await downloadRoute(get(reviewer, `/api/attachments/${attachmentId}?thumb=1`), ctx({ attachmentId }));
    expect(res.status).toBe(200);
    const meta = await sharp(Buffer.from(await res.arrayBuffer())).metadata();
    expect(meta.format).toBe("webp");
    expect(meta.width).toBeLessThanOrEqual(320);
  });

  it("refuses a research nurse (403) and another site's clinician (404)", async () => {
    const n = await downloadRoute(get(nurse, `/api/attachments/${attachmentId}`), ctx({ attachmentId }));
    expect(n.status).toBe(403);
    const o = await downloadRoute(get(otherClinician, `/api/attachments/${attachmentId}`), ctx({ attachmentId }));
    expect(o.status).toBe(404);
    const list = await listRoute(get(otherClinician, `/api/visits/${visitA}/attachments`), ctx({ visitId: visitA }));
    expect(list.status).toBe(404);
  });

  it("audits every view", async () => {
    const [r] = await db
      .select({ n: count() })
      .from(auditEvents)
      .where(and(eq(auditEvents.entityId, attachmentId), eq(auditEvents.action, "attachment.view")));
    expect(r!.n).toBeGreaterThanOrEqual(1);
  });

  it("lists with the lesion's map position", async () => {
    const res = await listRoute(get(reviewer, `/api/visits/${visitA}/attachments`), ctx({ visitId: visitA }));
    const body = await res.json();
    const item = body.attachments.find((a: { id: string }) => a.id === attachmentId);
    expect(item.lesion).toMatchObject({ label: "L1", clockStartH: 1, clockEndH: 3, distanceStartCm: 1, distanceEndCm: 2 });
    expect(item.caption).toBe("After acetic acid");
  });

  it("is deleted with its objects while the visit is a draft, and refused once signed (423)", async () => {
    const res = await upload(clinician, visitA, await jpegWithGps(), "b.jpg", "image/jpeg");
    const id = (await res.json()).attachment.id as string;
    const [row] = await db.select().from(attachments).where(eq(attachments.id, id));
    const del = await deleteRoute(new Request(`${ORIGIN}/api/attachments/${id}`, { method: "DELETE", headers: { cookie: clinician.cookie, origin: ORIGIN, host: "dentate.test" } }), ctx({ attachmentId: id }));
    expect(del.status).toBe(200);
    const keys = await bucketKeys();
    expect(keys).not.toContain(row!.objectKey);
    expect(keys).not.toContain(row!.thumbKey);

    await db.update(visits).set({ status: "signed", signedAt: new Date(), signedBy: clinician.userId }).where(eq(visits.id, visitA));
    const locked = await deleteRoute(new Request(`${ORIGIN}/api/attachments/${attachmentId}`, { method: "DELETE", headers: { cookie: clinician.cookie, origin: ORIGIN, host: "dentate.test" } }), ctx({ attachmentId }));
    expect(locked.status).toBe(423);
    expect(await rowsFor(visitA)).toBe(1);
  });

  it("refuses a file for a signed visit with 423 unless it belongs to an addendum of that visit, and records which addendum", async () => {
    // visitA was signed by the test above. A signed record is closed; later additions are
    // addenda (common practice, no source: the same lock the delete path applies).
    const before = { rows: await rowsFor(visitA), keys: await bucketKeys() };
    const png = new Uint8Array(await sharp({ create: { width: 40, height: 30, channels: 3, background: "#a05a50" } }).png().toBuffer());
    const refused = await upload(clinician, visitA, png, "late.png", "image/png");
    expect(refused.status).toBe(423);
    const [other] = await db.insert(addenda).values({ visitId: visitB, siteId: siteB, authorId: otherClinician.userId, body: "Invented note on another visit." }).returning({ id: addenda.id });
    const wrong = await upload(clinician, visitA, png, "late.png", "image/png", { addendumId: other!.id });
    expect(wrong.status).toBe(400);
    expect(await rowsFor(visitA)).toBe(before.rows);
    expect(await bucketKeys()).toEqual(before.keys);

    const [add] = await db.insert(addenda).values({ visitId: visitA, siteId: siteA, authorId: clinician.userId, body: "Invented: photograph of the healed site added." }).returning({ id: addenda.id });
    const ok = await upload(clinician, visitA, png, "late.png", "image/png", { addendumId: add!.id });
    expect(ok.status).toBe(201);
    const id = (await ok.json()).attachment.id as string;
    const [row] = await db.select({ addendumId: attachments.addendumId }).from(attachments).where(eq(attachments.id, id));
    expect(row!.addendumId).toBe(add!.id);
    const [audit] = await db.select({ detail: auditEvents.detail }).from(auditEvents).where(and(eq(auditEvents.entityId, id), eq(auditEvents.action, "attachment.upload")));
    expect((audit!.detail as { addendumId?: string }).addendumId).toBe(add!.id);
  });
});
