import { describe, expect, it } from "vitest";
import sharp from "sharp";
import { sniffUpload } from "./sniff";

const enc = (s: string) => new TextEncoder().encode(s);

async function solid(format: "jpeg" | "png" | "webp"): Promise<Uint8Array> {
  const img = sharp({ create: { width: 8, height: 8, channels: 3, background: { r: 10, g: 20, b: 30 } } });
  return new Uint8Array(await img.toFormat(format).toBuffer());
}

describe("sniffUpload decides by content", () => {
  it("accepts real JPEG, PNG and WebP bytes", async () => {
    // JPEG starts FF D8 FF (ITU-T T.81 / ISO 10918-1 SOI marker); PNG with the 8-byte signature
    // 89 50 4E 47 0D 0A 1A 0A (PNG spec §5.2); WebP with "RIFF....WEBP" (RFC 9649 §2).
    expect((await sniffUpload(await solid("jpeg")))?.mime).toBe("image/jpeg");
    expect((await sniffUpload(await solid("png")))?.mime).toBe("image/png");
    expect((await sniffUpload(await solid("webp")))?.mime).toBe("image/webp");
  });

  it("accepts a PDF by its %PDF- header (ISO 32000-1 §7.5.2)", async () => {
    const pdf = enc("%PDF-1.4\n1 0 obj\n<< /Type /Catalog >>\nendobj\ntrailer\n<< /Root 1 0 R >>\n%%EOF\n");
    expect(await sniffUpload(pdf)).toEqual({ mime: "application/pdf", ext: "pdf", kind: "document" });
  });

  it("refuses an HTML document whatever it would be called", async () => {
    expect(await sniffUpload(enc("<!doctype html><html><script>alert(1)</script></html>"))).toBeNull();
  });

  it("refuses an ELF program (magic 7F 'E' 'L' 'F', System V ABI / ELF spec)", async () => {
    const elf = new Uint8Array(64);
    elf.set([0x7f, 0x45, 0x4c, 0x46, 2, 1, 1, 0]);
    expect(await sniffUpload(elf)).toBeNull();
  });

  it("refuses a Windows PE program (\"MZ\" DOS header, Microsoft PE/COFF specification)", async () => {
    const pe = new Uint8Array(256);
    pe.set([0x4d, 0x5a]);
    pe.set([0x80, 0, 0, 0], 0x3c); // e_lfanew → "PE\0\0" at 0x80
    pe.set([0x50, 0x45, 0, 0], 0x80);
    expect(await sniffUpload(pe)).toBeNull();
  });

  it("refuses an accepted signature that is not ours (GIF87a/89a header, GIF spec)", async () => {
    expect(await sniffUpload(enc("GIF89a\x01\x00\x01\x00\x00\x00\x00;"))).toBeNull();
  });

  it("refuses empty input", async () => {
    expect(await sniffUpload(new Uint8Array())).toBeNull();
  });
});
