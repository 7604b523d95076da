import { describe, expect, it } from "vitest";
import { attachmentKeys, downloadName } from "./object-keys";
import { maxUploadBytes, DEFAULT_MAX_UPLOAD_BYTES } from "./limits";

const site = "11111111-1111-4111-8111-111111111111";
const visit = "22222222-2222-4222-8222-222222222222";
const att = "33333333-3333-4333-8333-333333333333";

describe("attachmentKeys", () => {
  it("builds keys from server-made ids only", () => {
    expect(attachmentKeys({ siteId: site, visitId: visit, attachmentId: att, ext: "jpg" }, true)).toEqual({
      objectKey: `sites/${site}/visits/${visit}/${att}.jpg`,
      thumbKey: `sites/${site}/visits/${visit}/${att}.thumb.webp`,
    });
  });

  it("refuses anything that is not an id, such as a path trick or a NUL byte", () => {
    expect(() => attachmentKeys({ siteId: site, visitId: visit, attachmentId: "../../x", ext: "jpg" }, false)).toThrow(RangeError);
    expect(() => attachmentKeys({ siteId: site, visitId: "a\u0000b", attachmentId: att, ext: "jpg" }, false)).toThrow(RangeError);
    expect(() => attachmentKeys({ siteId: site, visitId: visit, attachmentId: att, ext: "jpg/../../x" }, false)).toThrow(RangeError);
  });

  it("gives downloads a name made of our own words", () => {
    // RFC 6266 §4.3: recipients must not trust path information in the filename; we send none.
    expect(downloadName("photo", "2026-02-03", att, "jpg")).toBe("dentate-photo-2026-02-03-33333333.jpg");
    expect(downloadName("document", "../../etc", att, "p/df")).toBe("dentate-document-undated-33333333.bin");
  });
});

describe("maxUploadBytes", () => {
  it("reads megabytes from the environment and falls back on nonsense", () => {
    expect(maxUploadBytes({ DENTATE_MAX_UPLOAD_MB: "2" })).toBe(2 * 1024 * 1024);
    expect(maxUploadBytes({ DENTATE_MAX_UPLOAD_MB: "-1" })).toBe(DEFAULT_MAX_UPLOAD_BYTES);
    expect(maxUploadBytes({})).toBe(15 * 1024 * 1024);
  });
});
