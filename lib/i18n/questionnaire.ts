// The questionnaire's answers as question/answer lines in the language the consent was signed in,
// worded from the message catalogues (the patient saw these very questions).
import { QUESTIONS, type QuestionnaireAnswers } from "@/lib/domain/consent-questionnaire";
import type { Locale } from "./locale";
import { messagesFor } from "./messages";

export function answerLinesIn(answers: QuestionnaireAnswers, locale: Locale): { question: string; answer: string }[] {
  const q = messagesFor(locale).questionnaire;
  const lines = QUESTIONS.map((x) => ({ question: q.questions[x.key], answer: q.answers[answers[x.key]] }));
  lines.push({ question: q.otherAllergies, answer: answers.otherAllergies.trim() || q.noneGiven });
  lines.push({ question: q.medicinesTaken, answer: answers.medicines.trim() || q.noneGiven });
  lines.push({ question: q.anythingElse, answer: answers.notes.trim() || q.nothingGiven });
  return lines;
}
