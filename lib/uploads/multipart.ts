import { AppError } from "@/lib/errors";
import { MULTIPART_OVERHEAD_BYTES, formatMegabytes } from "./limits";

// Reads a multipart body without ever holding more than the limit: the declared length is
// checked first, then the stream is counted as it arrives (a chunked body declares nothing).

export async function readMultipartLimited(req: Request, maxFileBytes: number): Promise<FormData> {
  const limit = maxFileBytes + MULTIPART_OVERHEAD_BYTES;
  const tooLarge = () => new AppError("too_large", `The file is larger than the ${formatMegabytes(maxFileBytes)} limit.`);
  const type = req.headers.get("content-type") ?? "";
  if (!type.toLowerCase().startsWith("multipart/form-data")) {
    throw new AppError("invalid", "Send the file as multipart/form-data.", { file: ["Choose a file to upload."] });
  }
  const declared = Number(req.headers.get("content-length") ?? 0);
  if (declared > limit) throw tooLarge();
  if (!req.body) throw new AppError("invalid", undefined, { file: ["Choose a file to upload."] });
  const reader = req.body.getReader();
  const chunks: Uint8Array[] = [];
  let total = 0;
  for (;;) {
    const { done, value } = await reader.read();
    if (done) break;
    total += value.byteLength;
    if (total > limit) {
      await reader.cancel().catch(() => {});
      throw tooLarge();
    }
    chunks.push(value);
  }
  const body = new Uint8Array(total);
  let at = 0;
  for (const c of chunks) {
    body.set(c, at);
    at += c.byteLength;
  }
  try {
    return await new Response(body, { headers: { "content-type": type } }).formData();
  } catch {
    throw new AppError("invalid", "The upload could not be read.", { file: ["Choose a file to upload."] });
  }
}
