// Length caps for text a person or a browser can put into a document we lay out (the consent PDF):
// the zod schemas refuse longer input where it enters, and the PDF clips every text to the same
// caps once more, so text that arrives another way (a header, an old row) cannot grow the layout.

export const TEXT_LIMITS = {
  /** A person's name: the typed signature name, a patient or staff name. */
  personName: 120,
  /** An e-mail address shown in place of a missing name (RFC 5321 caps a path at 256 octets). */
  email: 254,
  clinicName: 120,
  address: 300,
  /** Questionnaire: other allergies, in the patient's words. */
  otherAllergies: 500,
  /** Questionnaire: medicines and notes, in the patient's words. */
  answer: 1000,
  withdrawReason: 500,
  templateTitle: 200,
  sectionHeading: 200,
  sectionBody: 8000,
  /** An IP address as recorded (an IPv6 text form with a zone fits well below this). */
  ip: 64,
  userAgent: 512,
  /** A batch/lot string: GS1 AI (10) allows up to 20 characters; typed lots are capped at 40. */
  lot: 40,
  /** Anything else laid out from data (a material's caution, a visit fact). */
  line: 2000,
} as const;

export type TextLimit = keyof typeof TEXT_LIMITS;

/** Cuts a text to at most `max` code points, marking the cut with an ellipsis. */
export function clipText(text: string, max: number): string {
  if (text.length <= max) return text;
  const points = Array.from(text);
  if (points.length <= max) return text;
  return points.slice(0, Math.max(0, max - 1)).join("") + "…";
}
