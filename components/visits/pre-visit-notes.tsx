import { visitLengthRange } from "@/lib/domain/timeline";

/** What a patient should know before a long single visit ([C] common practice, no source). */
export function PreVisitNotes({ minutes }: { minutes: number }) {
  return (
    <section className="card" aria-labelledby="before">
      <h2 id="before" className="text-lg font-semibold">Before your visit</h2>
      <ul className="mt-2 list-disc space-y-1 pl-5 text-ink-soft">
        <li>Plan for the whole visit, {visitLengthRange(minutes).text}. Your crown is made while you wait.</li>
        <li>Eat a normal meal beforehand: your mouth may be numb for a few hours afterwards.</li>
        <li>Bring a list of the medicines you take, including blood thinners.</li>
        <li>If you feel unwell, have a fever or a new swelling, call the clinic before coming.</li>
      </ul>
    </section>
  );
}
