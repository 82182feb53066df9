// Pure rules for documents: kinds per role, allowed content, names and storage keys.
import { describe, expect, it } from "vitest";
import {
  ACCEPT_ATTRIBUTE, DOCUMENT_KINDS, downloadName, fileNameProblem, formatBytes, isAllowedContentType, isUuid, kindsFor,
  MAX_DOCUMENT_BYTES, mayUploadKind, megabytesRoundedUp, objectKeyFor, sizeParts, tooLargeMessage, unsupportedContentMessage,
} from "@/lib/domain/documents";
import { documentFieldsSchema } from "@/lib/documents/schema";

const CLINIC = "0b5c3a4e-6a43-4c1b-9d55-1f0a2b3c4d5e";
const DOC = "7e1f0c2a-3b4d-4e5f-8a9b-0c1d2e3f4a5b";

describe("document kinds", () => {
  it("lets patients add their own papers and photos but not the clinic's replies or scan exports", () => {
    expect(kindsFor("patient")).toEqual([
      "insurance_card_front", "insurance_card_back", "referral_letter", "tooth_photo", "medicines_list", "other",
    ]);
    expect(mayUploadKind("patient", "referral_reply")).toBe(false);
    expect(mayUploadKind("patient", "scan_export")).toBe(false);
    for (const role of ["reception", "dentist", "admin"] as const) expect(kindsFor(role)).toEqual([...DOCUMENT_KINDS]);
  });
});

describe("allowed content", () => {
  it("accepts JPEG, PNG, WebP and PDF only", () => {
    for (const mime of ["image/jpeg", "image/png", "image/webp", "application/pdf"]) expect(isAllowedContentType(mime)).toBe(true);
    for (const mime of ["image/heic", "image/gif", "text/html", "image/svg+xml", "model/stl", "application/zip", undefined, "constructor"]) {
      expect(isAllowedContentType(mime)).toBe(false);
    }
    expect(ACCEPT_ATTRIBUTE).toContain("application/pdf");
    expect(ACCEPT_ATTRIBUTE).toContain(".jpeg");
  });

  it("explains HEIC separately from other content", () => {
    expect(unsupportedContentMessage("image/heic")).toMatch(/HEIC.*JPEG/);
    expect(unsupportedContentMessage("text/html")).toBe(
      "This file is not a photo (JPEG, PNG or WebP) or a PDF, whatever its name says. Please choose a photo (JPEG, PNG or WebP) or a PDF.",
    );
  });

  it("sets the limit at 15 MB and says so with the file's size", () => {
    expect(MAX_DOCUMENT_BYTES).toBe(15_728_640);
    expect(tooLargeMessage(20 * 1024 * 1024)).toMatch(/^This file is 20\.0 MB; the limit is 15 MB\./);
    expect(tooLargeMessage(MAX_DOCUMENT_BYTES + 1)).toMatch(/^This file is 15\.1 MB;/);
    expect(tooLargeMessage()).toMatch(/larger than 15 MB/);
    expect(formatBytes(512)).toBe("512 bytes");
    expect(formatBytes(2048)).toBe("2 KB");
    expect(formatBytes(1.5 * 1024 * 1024)).toBe("1.5 MB");
  });
});

describe("file names", () => {
  it("accepts plain names, including accents and spaces", () => {
    for (const name of ["IMG_0042.jpg", "Überweisung März.pdf", "card front (1).png", "a..b.jpg"]) expect(fileNameProblem(name)).toBeNull();
  });

  it("refuses names that look like paths or carry control characters", () => {
    for (const name of ["../../etc/passwd", "..\\windows\\win.ini", "folder/photo.jpg", "C:\\fakepath\\x.jpg", "..", ".", "..hidden"]) {
      expect(fileNameProblem(name), name).toMatch(/folder path/);
    }
    expect(fileNameProblem("photo\u0000.jpg")).toMatch(/control characters/);
    expect(fileNameProblem("a".repeat(256))).toMatch(/too long/);
  });

  it("builds download names from the title and the detected type, never from the uploaded name", () => {
    expect(downloadName("Insurance card (front)", "image/jpeg")).toBe("Insurance card (front).jpg");
    expect(downloadName("../../secret\"; x", "application/pdf")).toBe(".. .. secret x.pdf");
    expect(downloadName("///", "image/png")).toBe("document.png");
  });

  it("makes storage keys from ids only", () => {
    expect(objectKeyFor(CLINIC, DOC)).toBe(`documents/${CLINIC}/${DOC}`);
    expect(() => objectKeyFor(CLINIC, "../other")).toThrow(/ids only/);
    expect(() => objectKeyFor("x", DOC)).toThrow(/ids only/);
    expect(isUuid(DOC.toUpperCase())).toBe(true);
    expect(isUuid(`${DOC}/..`)).toBe(false);
  });
});

describe("upload form fields", () => {
  it("requires a known kind and a short title, trims it, and takes an optional patient id", () => {
    expect(documentFieldsSchema.parse({ kind: "tooth_photo", title: "  Upper left  " })).toEqual({ kind: "tooth_photo", title: "Upper left" });
    const bad = documentFieldsSchema.safeParse({ kind: "x-ray", title: " " });
    expect(bad.success).toBe(false);
    expect(bad.error?.issues.map((i) => i.path.join("."))).toEqual(["kind", "title"]);
    expect(documentFieldsSchema.safeParse({ kind: "other", title: "t".repeat(121) }).success).toBe(false);
    expect(documentFieldsSchema.safeParse({ kind: "other", title: "ok", patientId: "12" }).error?.issues[0].path).toEqual(["patientId"]);
  });
});

describe("sizes in any language", () => {
  it("splits a size into number and unit the way formatBytes words it", () => {
    expect(sizeParts(512)).toEqual({ unit: "bytes", n: 512, decimals: 0 });
    expect(sizeParts(2048)).toEqual({ unit: "kb", n: 2, decimals: 0 });
    expect(sizeParts(1.5 * 1024 * 1024)).toEqual({ unit: "mb", n: 1.5, decimals: 1 });
    expect(sizeParts(12 * 1024 * 1024)).toEqual({ unit: "mb", n: 12, decimals: 0 });
    expect(formatBytes(2 * 1024 * 1024)).toBe("2.0 MB");
  });

  it("rounds an oversized file up, so just over the limit never reads as the limit", () => {
    expect(megabytesRoundedUp(MAX_DOCUMENT_BYTES + 1)).toBe(15.1);
    expect(megabytesRoundedUp(20 * 1024 * 1024)).toBe(20);
  });
});
