// Multipart upload with progress: fetch() cannot report upload progress, XMLHttpRequest can.
// Errors come back in the API's one shape, so the server's own message is what the user reads.
import { ApiError } from "@/components/data/fetcher";

export function uploadWithProgress(url: string, form: FormData, onProgress: (fraction: number) => void): Promise<unknown> {
  return new Promise((resolve, reject) => {
    const xhr = new XMLHttpRequest();
    xhr.open("POST", url);
    xhr.responseType = "json";
    xhr.setRequestHeader("accept", "application/json");
    xhr.upload.onprogress = (e) => {
      if (e.lengthComputable) onProgress(e.loaded / e.total);
    };
    xhr.onload = () => {
      const body = xhr.response as { error?: { code?: string; message?: string; fields?: Record<string, string[]> } } | null;
      if (xhr.status >= 200 && xhr.status < 300) return resolve(body);
      const err = body?.error;
      const fieldMessage = err?.fields ? Object.values(err.fields).flat()[0] : undefined;
      reject(new ApiError(xhr.status, err?.code ?? `http_${xhr.status}`, fieldMessage ?? err?.message ?? `The server answered ${xhr.status}.`, err?.fields));
    };
    xhr.onerror = () => reject(new ApiError(0, "network", "The server could not be reached. Check the connection."));
    xhr.send(form);
  });
}
