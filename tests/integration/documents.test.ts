// Documents end to end through the route handlers, against PostgreSQL and the S3 fake named by
// S3_ENDPOINT. The session is faked; everything else (content checks, storage, audit) is real.
import exifr from "exifr";
import { NextRequest } from "next/server";
import { afterEach, beforeAll, describe, expect, it, vi } from "vitest";
import { AuditEvent, PatientDocument } from "@/db/models";
import { MAX_DOCUMENT_BYTES } from "@/lib/domain/documents";
import { getObjectBytes, listObjectKeys, objectExists } from "@/lib/storage/s3";
import { createTestClinic, createTestPatient, type TestClinic } from "../support/fixtures";
import { signInAs, signOut } from "../support/session";
import sharp from "sharp";
import { MAX_IMAGE_PIXELS } from "@/lib/domain/image-limits";
import { hugePng, jpegWithGps, pdfDocument, pngImage } from "../support/sample-files";

vi.mock("@/lib/auth/session", async () => (await import("../support/session")).fakeSessionModule());

const { GET: listRoute, POST: uploadRoute } = await import("@/app/api/documents/route");
const { GET: openRoute } = await import("@/app/api/documents/[id]/route");

const as = signInAs;

let t: TestClinic;
let other: TestClinic;
let alice: Awaited<ReturnType<typeof createTestPatient>>;
let bruno: Awaited<ReturnType<typeof createTestPatient>>;

beforeAll(async () => {
  t = await createTestClinic();
  other = await createTestClinic();
  alice = await createTestPatient(t.clinic.id, "Alice Testpatient");
  bruno = await createTestPatient(t.clinic.id, "Bruno Testpatient");
});

afterEach(() => {
  signOut();
  vi.restoreAllMocks();
});

function form(fields: Record<string, string>, file?: { bytes: Uint8Array; name: string; type: string }): FormData {
  const f = new FormData();
  for (const [k, v] of Object.entries(fields)) f.set(k, v);
  if (file) f.set("file", new File([Buffer.from(file.bytes)], file.name, { type: file.type }));
  return f;
}

async function upload(body: FormData | { raw: Buffer; contentType: string }) {
  const init = body instanceof FormData
    ? { method: "POST", body }
    : { method: "POST", body: new Uint8Array(body.raw), headers: { "content-type": body.contentType } };
  const res = await uploadRoute(new NextRequest("http://localhost/api/documents", init), undefined);
  return { status: res.status, body: await res.json() };
}

async function open(id: string, query = "") {
  return openRoute(new NextRequest(`http://localhost/api/documents/${id}${query}`), { params: Promise.resolve({ id }) });
}

/** What is stored for a clinic, in the table and in the bucket. */
async function stored(clinicId: string) {
  return {
    rows: await PatientDocument.count({ where: { clinicId } }),
    objects: (await listObjectKeys(`documents/${clinicId}/`)).length,
  };
}

describe("uploading", () => {
  it("stores a patient's photo without its GPS position, with its row and audit event", async () => {
    as(alice.user);
    const before = await stored(t.clinic.id);
    const photo = await jpegWithGps();
    expect((await exifr.gps(photo))?.latitude).toBeGreaterThan(43);

    const res = await upload(form({ kind: "tooth_photo", title: "Upper left, sore" }, { bytes: photo, name: "IMG_0042.jpg", type: "image/jpeg" }));
    expect(res.status).toBe(201);
    expect(res.body).toEqual({ id: expect.any(String) });

    const row = await PatientDocument.findByPk(res.body.id);
    expect(row).toMatchObject({
      patientId: alice.patient.id, clinicId: t.clinic.id, uploadedById: alice.user.id, uploaderRole: "patient",
      kind: "tooth_photo", title: "Upper left, sore", contentType: "image/jpeg", objectKey: `documents/${t.clinic.id}/${res.body.id}`,
    });
    // The uploaded file name never reaches the storage path.
    expect(row!.objectKey).not.toContain("IMG_0042");

    // Read the stored bytes back from the bucket and look for GPS with a general-purpose EXIF reader.
    const bytes = await getObjectBytes(row!.objectKey);
    expect(bytes?.byteLength).toBe(row!.byteSize);
    expect(await exifr.gps(bytes!)).toBeUndefined();
    const tags = await exifr.parse(bytes!, { tiff: true, exif: true, gps: true, xmp: true });
    expect(Object.keys(tags ?? {}).filter((k) => /gps|latitude|longitude/i.test(k))).toEqual([]);

    const audit = await AuditEvent.findOne({ where: { action: "document.uploaded", subjectId: res.body.id } });
    expect(audit).toMatchObject({ actorUserId: alice.user.id, clinicId: t.clinic.id, subjectType: "document" });
    expect(await stored(t.clinic.id)).toEqual({ rows: before.rows + 1, objects: before.objects + 1 });
  });

  it("lets staff upload to a patient of their clinic, including clinic-only kinds", async () => {
    as(t.staff.reception);
    const res = await upload(form(
      { kind: "referral_reply", title: "Reply to the referring dentist", patientId: alice.patient.id },
      { bytes: pdfDocument(), name: "reply.pdf", type: "application/pdf" },
    ));
    expect(res.status).toBe(201);
    const row = await PatientDocument.findByPk(res.body.id);
    expect(row).toMatchObject({ patientId: alice.patient.id, uploaderRole: "reception", kind: "referral_reply", contentType: "application/pdf" });
    expect(Buffer.from((await getObjectBytes(row!.objectKey))!).equals(pdfDocument())).toBe(true);
  });

  it("takes the type from the content, not the name or the browser's claim", async () => {
    as(alice.user);
    const res = await upload(form({ kind: "insurance_card_front", title: "Card" }, { bytes: await pngImage(), name: "card.pdf", type: "application/pdf" }));
    expect(res.status).toBe(201);
    expect((await PatientDocument.findByPk(res.body.id))?.contentType).toBe("image/png");
  });
});

describe("bad input and security: refused with a clear message, nothing stored", () => {
  async function expectRefused(body: Parameters<typeof upload>[0], status: number, error: RegExp, field?: string) {
    const before = await stored(t.clinic.id);
    const res = await upload(body);
    expect(res.status).toBe(status);
    expect(res.body.error).toMatch(error);
    if (field) expect(res.body.field).toBe(field);
    expect(await stored(t.clinic.id)).toEqual(before);
  }

  it("a file whose content is not what it claims (415)", async () => {
    as(alice.user);
    await expectRefused(
      form({ kind: "tooth_photo", title: "Photo" }, { bytes: Buffer.from("<html><script>alert(1)</script></html>"), name: "photo.jpg", type: "image/jpeg" }),
      415, /not a photo \(JPEG, PNG or WebP\) or a PDF/, "file",
    );
  });

  it("an oversized file (413)", async () => {
    as(alice.user);
    const big = Buffer.concat([await jpegWithGps(), Buffer.alloc(MAX_DOCUMENT_BYTES)]);
    await expectRefused(form({ kind: "tooth_photo", title: "Big" }, { bytes: big, name: "big.jpg", type: "image/jpeg" }), 413, /^This file is 15\.1 MB; the limit is 15 MB\./, "file");
  });

  it("an image of few bytes but too many pixels, before it is decoded (422)", async () => {
    as(alice.user);
    const png = hugePng(16_000, 16_000);
    expect(png.byteLength).toBeLessThan(100_000);
    // sharp (libvips) reads the crafted header as a 16,000 × 16,000 PNG: 256 megapixels. [C] the size
    // a general-purpose decoder sees, read from the header only.
    expect(await sharp(png).metadata()).toMatchObject({ format: "png", width: 16_000, height: 16_000 });
    expect(16_000 * 16_000).toBeGreaterThan(MAX_IMAGE_PIXELS);
    const decode = vi.spyOn(sharp.prototype, "toBuffer");
    await expectRefused(
      form({ kind: "tooth_photo", title: "Huge" }, { bytes: png, name: "huge.png", type: "image/png" }),
      422, /^This image is 16,000 × 16,000 pixels \(256 megapixels\); the limit is 40 megapixels\./, "file",
    );
    expect(decode).not.toHaveBeenCalled();
    // Just under the limit still goes through.
    const fits = await upload(form({ kind: "tooth_photo", title: "Wide" }, { bytes: hugePng(8_000, 5_000), name: "wide.png", type: "image/png" }));
    expect(fits.status).toBe(201);
    expect(decode).toHaveBeenCalled(); // the spy does see a decode when one happens
  });

  it("an oversized body announced by its Content-Length is refused before it is read (413)", async () => {
    as(alice.user);
    const before = await stored(t.clinic.id);
    const req = new NextRequest("http://localhost/api/documents", {
      method: "POST",
      body: new ReadableStream({ start: (c) => c.close() }),
      headers: { "content-type": "multipart/form-data; boundary=x", "content-length": String(MAX_DOCUMENT_BYTES * 2) },
      // A streamed body needs `duplex` in Node's fetch types.
      duplex: "half",
    } as ConstructorParameters<typeof NextRequest>[1]);
    const res = await uploadRoute(req, undefined);
    expect(res.status).toBe(413);
    expect((await res.json()).error).toMatch(/15 MB/);
    expect(await stored(t.clinic.id)).toEqual(before);
  });

  it("a path-like file name (400)", async () => {
    as(alice.user);
    const photo = await jpegWithGps();
    for (const name of ["../../etc/passwd.jpg", "..\\..\\boot.jpg", "uploads/photo.jpg"]) {
      // Written by hand: a browser would never send a folder in the name.
      const boundary = "----cuspal-test-boundary";
      const raw = Buffer.concat([
        Buffer.from(`--${boundary}\r\nContent-Disposition: form-data; name="kind"\r\n\r\ntooth_photo\r\n`),
        Buffer.from(`--${boundary}\r\nContent-Disposition: form-data; name="title"\r\n\r\nPhoto\r\n`),
        Buffer.from(`--${boundary}\r\nContent-Disposition: form-data; name="file"; filename="${name}"\r\nContent-Type: image/jpeg\r\n\r\n`),
        photo,
        Buffer.from(`\r\n--${boundary}--\r\n`),
      ]);
      await expectRefused({ raw, contentType: `multipart/form-data; boundary=${boundary}` }, 400, /folder path/, "file");
    }
  });

  it("an upload with no session (401)", async () => {
    signOut();
    await expectRefused(form({ kind: "tooth_photo", title: "Photo" }, { bytes: await jpegWithGps(), name: "p.jpg", type: "image/jpeg" }), 401, /sign in/);
  });

  it("missing fields, a clinic-only kind from a patient, and staff without a patient (400)", async () => {
    as(alice.user);
    const photo = { bytes: await jpegWithGps(), name: "p.jpg", type: "image/jpeg" };
    await expectRefused(form({ kind: "tooth_photo", title: "Photo" }), 400, /Choose a file/, "file");
    await expectRefused(form({ kind: "tooth_photo" }, photo), 400, /title/, "title");
    await expectRefused(form({ kind: "x-ray", title: "Photo" }, photo), 400, /kind of document/, "kind");
    await expectRefused(form({ kind: "scan_export", title: "Scan" }, photo), 400, /added by the clinic/, "kind");
    await expectRefused(new FormData(), 400, /Choose a file/, "file");
    // Not a form at all: the upload route reads multipart only (415, unsupported media type).
    await expectRefused({ raw: Buffer.from("{}"), contentType: "application/json" }, 415, /multipart\/form-data/);
    as(t.staff.dentist);
    await expectRefused(form({ kind: "scan_export", title: "Scan" }, photo), 400, /Choose the patient/, "patientId");
  });

  it("a patient of another clinic, or another patient's id from a patient (404)", async () => {
    const photo = { bytes: await jpegWithGps(), name: "p.jpg", type: "image/jpeg" };
    const stranger = await createTestPatient(other.clinic.id, "Stranger Testpatient");
    as(t.staff.reception);
    await expectRefused(form({ kind: "other", title: "x", patientId: stranger.patient.id }, photo), 404, /not found/);
    as(alice.user);
    await expectRefused(form({ kind: "other", title: "x", patientId: bruno.patient.id }, photo), 404, /not found/);
    expect(await stored(other.clinic.id)).toEqual({ rows: 0, objects: 0 });
  });

  it("leaves no object behind when the row cannot be saved", async () => {
    as(alice.user);
    vi.spyOn(PatientDocument, "create").mockRejectedValueOnce(new Error("simulated database failure"));
    vi.spyOn(console, "error").mockImplementation(() => undefined);
    await expectRefused(form({ kind: "tooth_photo", title: "Photo" }, { bytes: await jpegWithGps(), name: "p.jpg", type: "image/jpeg" }), 500, /went wrong/);
  });
});

describe("access, viewing and download", () => {
  let aliceDoc: string;
  let brunoDoc: string;

  beforeAll(async () => {
    as(alice.user);
    aliceDoc = (await upload(form({ kind: "medicines_list", title: "My medicines" }, { bytes: pdfDocument("medicines"), name: "m.pdf", type: "application/pdf" }))).body.id;
    as(bruno.user);
    brunoDoc = (await upload(form({ kind: "referral_letter", title: "Letter" }, { bytes: pdfDocument("letter"), name: "l.pdf", type: "application/pdf" }))).body.id;
    signOut();
  });

  it("lets the patient open their own document, and records the view and the download", async () => {
    as(alice.user);
    const res = await open(aliceDoc);
    expect(res.status).toBe(200);
    expect(res.headers.get("content-type")).toBe("application/pdf");
    // An uploaded PDF is never shown from our own origin: always saved.
    expect(res.headers.get("content-disposition")).toMatch(/^attachment; filename="My medicines\.pdf"/);
    expect(res.headers.get("content-security-policy")).toMatch(/^sandbox/);
    expect(res.headers.get("cache-control")).toBe("private, no-store");
    expect(Buffer.from(await res.arrayBuffer()).equals(pdfDocument("medicines"))).toBe(true);
    const saved = await open(aliceDoc, "?download=1");
    expect(saved.headers.get("content-disposition")).toMatch(/^attachment;/);
    await saved.arrayBuffer();
    const actions = (await AuditEvent.findAll({ where: { subjectId: aliceDoc, actorUserId: alice.user.id } })).map((a) => a.action).sort();
    expect(actions).toEqual(["document.downloaded", "document.uploaded", "document.viewed"]);
  });

  it("gives another patient's document id a 404, like a missing one", async () => {
    as(alice.user);
    for (const id of [brunoDoc, "6d0c1a2b-0000-4000-8000-000000000000"]) {
      const res = await open(id);
      expect(res.status, id).toBe(404);
      expect(await res.json()).toEqual({ error: "That document was not found." });
    }
    // Something that cannot be an id at all is a bad request naming the field; it reveals nothing.
    for (const id of ["not-an-id", "..%2F..%2Fetc"]) {
      const res = await open(id);
      expect(res.status, id).toBe(400);
      expect(await res.json()).toEqual({ error: "id must be a record id (a UUID).", field: "id" });
    }
    expect(await AuditEvent.count({ where: { subjectId: brunoDoc, actorUserId: alice.user.id } })).toBe(0);
  });

  it("lets staff of the patient's clinic open it, and nobody else", async () => {
    as(t.staff.dentist);
    const res = await open(brunoDoc);
    expect(res.status).toBe(200);
    await res.arrayBuffer();
    expect(await AuditEvent.count({ where: { action: "document.viewed", subjectId: brunoDoc, actorUserId: t.staff.dentist.id } })).toBe(1);
    as(other.staff.admin);
    expect((await open(brunoDoc)).status).toBe(404);
    signOut();
    expect((await open(brunoDoc)).status).toBe(401);
  });

  it("lists only the patient's own documents, and records the listing", async () => {
    as(alice.user);
    const res = await listRoute(new NextRequest("http://localhost/api/documents"), undefined);
    const { documents } = await res.json();
    const ids = documents.map((d: { id: string }) => d.id);
    expect(ids).toContain(aliceDoc);
    expect(ids).not.toContain(brunoDoc);
    expect(documents.find((d: { id: string }) => d.id === aliceDoc)).toMatchObject({
      kind: "medicines_list", kindLabel: "Medicines list", title: "My medicines", uploadedBy: { name: "Alice Testpatient", role: "patient", isYou: true },
    });
    expect(await AuditEvent.count({ where: { action: "documents.listed", subjectId: alice.patient.id, actorUserId: alice.user.id } })).toBeGreaterThan(0);

    as(t.staff.reception);
    const staffList = await (await listRoute(new NextRequest(`http://localhost/api/documents?patientId=${bruno.patient.id}`), undefined)).json();
    expect(staffList.documents.map((d: { id: string }) => d.id)).toEqual([brunoDoc]);
    const noPatient = await listRoute(new NextRequest("http://localhost/api/documents"), undefined);
    expect(noPatient.status).toBe(400);
    as(other.staff.reception);
    expect((await listRoute(new NextRequest(`http://localhost/api/documents?patientId=${bruno.patient.id}`), undefined)).status).toBe(404);
  });

  it("keeps every row's object in the bucket", async () => {
    const rows = await PatientDocument.findAll({ where: { clinicId: t.clinic.id } });
    expect(rows.length).toBeGreaterThan(0);
    for (const row of rows) expect(await objectExists(row.objectKey), row.id).toBe(true);
  });
});
