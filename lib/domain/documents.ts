// Rules for documents that patients and staff attach to a patient: kinds, allowed content,
// size limit and file-name checks. Pure: no framework, no storage, no database.

/** Who may upload: the patient, or staff of the patient's clinic. */
export type UploaderRole = "patient" | "reception" | "dentist" | "admin";
export const UPLOADER_ROLE_LABEL: Record<UploaderRole, string> = {
  patient: "Patient", reception: "Reception", dentist: "Dentist", admin: "Clinic manager",
};

export const DOCUMENT_KINDS = [
  "insurance_card_front",
  "insurance_card_back",
  "referral_letter",
  "tooth_photo",
  "medicines_list",
  "referral_reply",
  "scan_export",
  "other",
] as const;
export type DocumentKind = (typeof DOCUMENT_KINDS)[number];

export const DOCUMENT_KIND_LABEL: Record<DocumentKind, string> = {
  insurance_card_front: "Insurance card (front)",
  insurance_card_back: "Insurance card (back)",
  referral_letter: "Referral letter",
  tooth_photo: "Tooth photo",
  medicines_list: "Medicines list",
  referral_reply: "Referral reply",
  scan_export: "Scan export",
  other: "Other",
};

// Replies to referrals and scan exports come from the clinic, not from the patient.
const STAFF_ONLY: readonly DocumentKind[] = ["referral_reply", "scan_export"];

export function kindsFor(role: UploaderRole): DocumentKind[] {
  return role === "patient" ? DOCUMENT_KINDS.filter((k) => !STAFF_ONLY.includes(k)) : [...DOCUMENT_KINDS];
}

export function mayUploadKind(role: UploaderRole, kind: DocumentKind): boolean {
  return kindsFor(role).includes(kind);
}

/** 15 MB, counted in binary megabytes like phones and file browsers do. */
export const MAX_DOCUMENT_BYTES = 15 * 1024 * 1024;

/**
 * Content types we store, keyed by the type detected from the bytes. HEIC is detected but not
 * accepted: we cannot yet remove its location data. 3D scan files (STL, PLY) are left out
 * because binary STL has no signature to check the content against.
 */
export const ALLOWED_CONTENT = {
  "image/jpeg": { ext: "jpg", label: "JPEG photo", image: true },
  "image/png": { ext: "png", label: "PNG image", image: true },
  "image/webp": { ext: "webp", label: "WebP image", image: true },
  "application/pdf": { ext: "pdf", label: "PDF", image: false },
} as const;
export type AllowedContentType = keyof typeof ALLOWED_CONTENT;

export function isAllowedContentType(mime: string | undefined | null): mime is AllowedContentType {
  return !!mime && Object.hasOwn(ALLOWED_CONTENT, mime);
}

/** The `accept` attribute for file pickers; the server checks the bytes regardless. */
export const ACCEPT_ATTRIBUTE = Object.entries(ALLOWED_CONTENT)
  .flatMap(([mime, c]) => [mime, `.${c.ext}`])
  .concat(".jpeg")
  .join(",");

export const ALLOWED_CONTENT_SENTENCE = "a photo (JPEG, PNG or WebP) or a PDF";

/** The message for content we cannot store, with a hint for the one case phones often produce. */
export function unsupportedContentMessage(detectedMime: string | undefined): string {
  if (detectedMime === "image/heic" || detectedMime === "image/heif" || detectedMime?.startsWith("image/heic") || detectedMime?.startsWith("image/heif")) {
    return "This photo is in HEIC format, which we cannot accept yet. Please save or share it as a JPEG and upload it again.";
  }
  return `This file is not ${ALLOWED_CONTENT_SENTENCE}, whatever its name says. Please choose ${ALLOWED_CONTENT_SENTENCE}.`;
}

/** A file size as a number and a unit, for words in any language: 1 decimal below 10 MB. */
export function sizeParts(bytes: number): { unit: "bytes" | "kb" | "mb"; n: number; decimals: 0 | 1 } {
  if (bytes < 1024) return { unit: "bytes", n: bytes, decimals: 0 };
  if (bytes < 1024 * 1024) return { unit: "kb", n: Math.round(bytes / 1024), decimals: 0 };
  const mb = bytes / (1024 * 1024);
  return mb < 10 ? { unit: "mb", n: Number(mb.toFixed(1)), decimals: 1 } : { unit: "mb", n: Math.round(mb), decimals: 0 };
}

export function formatBytes(bytes: number): string {
  const { unit, n, decimals } = sizeParts(bytes);
  return `${n.toFixed(decimals)} ${{ bytes: "bytes", kb: "KB", mb: "MB" }[unit]}`;
}

/** Megabytes with one decimal, rounded up, so a file just over the limit never reads as exactly 15 MB. */
export function megabytesRoundedUp(bytes: number): number {
  return Math.ceil((bytes / (1024 * 1024)) * 10) / 10;
}

export function tooLargeMessage(bytes?: number): string {
  const size = bytes === undefined ? "This file is larger than 15 MB, the limit." : `This file is ${megabytesRoundedUp(bytes).toFixed(1)} MB; the limit is 15 MB.`;
  return `${size} Please choose a smaller file, or take the photo again at a lower resolution.`;
}

/**
 * A file name from the browser is only ever shown, never used as a storage path. A name that
 * carries folders, parent references or control characters is not what a browser sends, so it
 * is refused rather than quietly cleaned.
 */
export function fileNameProblem(name: string): string | null {
  if (name.length > 255) return "The file name is too long (255 characters at most). Please rename the file.";
  if (/[\u0000-\u001f\u007f]/.test(name)) return "The file name contains control characters. Please rename the file.";
  if (/[/\\]/.test(name) || name === "." || name === ".." || name.startsWith("..")) {
    return "The file name looks like a folder path. Please send the file itself with a plain name.";
  }
  return null;
}

/** A safe name for the download header: the title plus the extension of the detected type. */
export function downloadName(title: string, contentType: AllowedContentType): string {
  const base = title.normalize("NFC").replace(/[^\p{L}\p{N} ()_.-]+/gu, " ").replace(/\s+/g, " ").trim().slice(0, 80) || "document";
  return `${base}.${ALLOWED_CONTENT[contentType].ext}`;
}

/** Object keys are made from ids only, so nothing a person types can reach the storage path. */
export function objectKeyFor(clinicId: string, documentId: string): string {
  if (!isUuid(clinicId) || !isUuid(documentId)) throw new Error("Object keys are built from ids only.");
  return `documents/${clinicId.toLowerCase()}/${documentId.toLowerCase()}`;
}

/** Ids in URLs are checked before they reach a query, so a malformed id is a plain 404. */
export function isUuid(value: string): boolean {
  return /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i.test(value);
}
