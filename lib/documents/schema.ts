// The upload form's fields (the file itself is checked by its bytes on the server), shared by
// the form in the browser and the route handler.
import { z } from "zod";
import { DOCUMENT_KINDS } from "@/lib/domain/documents";

export const TITLE_MAX = 120;

export const documentFieldsSchema = z.object({
  kind: z.enum(DOCUMENT_KINDS, { message: "Choose what kind of document this is." }),
  title: z
    .string({ message: "Give the document a short title." })
    .trim()
    .min(1, { message: "Give the document a short title." })
    .max(TITLE_MAX, { message: `Keep the title to ${TITLE_MAX} characters or fewer.` }),
  patientId: z.uuid({ message: "Choose the patient this document belongs to." }).optional(),
});
export type DocumentFields = z.infer<typeof documentFieldsSchema>;
