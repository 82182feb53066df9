// Reads a multipart upload without ever holding more than the size limit (plus the form's own
// overhead) in memory, so an oversized body is refused early with a 413.
import "server-only";
import { AppError, badRequest } from "@/lib/server/errors";
import { MAX_DOCUMENT_BYTES, tooLargeMessage } from "@/lib/domain/documents";

// Boundaries, headers and the small text fields of the form.
const FORM_OVERHEAD_BYTES = 64 * 1024;

const tooLarge = (bytes?: number) => new AppError(413, tooLargeMessage(bytes), { field: "file", code: "too_large" });

export async function readUploadForm(req: Request): Promise<FormData> {
  const limit = MAX_DOCUMENT_BYTES + FORM_OVERHEAD_BYTES;
  const type = req.headers.get("content-type") ?? "";
  if (!type.toLowerCase().startsWith("multipart/form-data")) {
    throw badRequest("Send the document as a form upload (multipart/form-data) with a file.", "file");
  }
  const declared = Number(req.headers.get("content-length"));
  if (Number.isFinite(declared) && declared > limit) throw tooLarge();
  if (!req.body) throw badRequest("Choose a file to upload.", "file");

  const reader = req.body.getReader();
  const chunks: Uint8Array[] = [];
  let total = 0;
  for (;;) {
    const { done, value } = await reader.read();
    if (done) break;
    total += value.byteLength;
    if (total > limit) {
      await reader.cancel().catch(() => undefined);
      throw tooLarge();
    }
    chunks.push(value);
  }
  try {
    return await new Response(Buffer.concat(chunks), { headers: { "content-type": type } }).formData();
  } catch {
    throw badRequest("The upload could not be read. Please try again.", "file");
  }
}

/** The file part, checked for presence and size; its name is only ever shown, never used as a path. */
export async function uploadedFile(form: FormData): Promise<{ name: string; bytes: Uint8Array }> {
  const file = form.get("file");
  if (!(file instanceof File) || file.size === 0) throw badRequest("Choose a file to upload.", "file");
  if (file.size > MAX_DOCUMENT_BYTES) throw tooLarge(file.size);
  return { name: file.name, bytes: new Uint8Array(await file.arrayBuffer()) };
}

export function formText(form: FormData, name: string): string | undefined {
  const value = form.get(name);
  return typeof value === "string" && value !== "" ? value : undefined;
}
