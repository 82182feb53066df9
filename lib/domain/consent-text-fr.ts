// The default consent template in Canadian French: the same sections, in the same order and with
// the same placeholders as DEFAULT_SECTIONS in consent-text.ts, one sentence or list item per
// array entry so a sentence added to the English text can be added here beside it.
import type { TemplateSection } from "./consent-text";

export const DEFAULT_TEMPLATE_TITLE_FR = "Consentement à une couronne en une seule visite";

const paragraphs = (...chunks: (string | string[])[]) => chunks.map((c) => (Array.isArray(c) ? c.join("\n") : c)).join("\n\n");
const list = (...items: string[]) => items.map((i) => `- ${i}`);

// Risks and alternatives: the same sources as the English text ([C] crown consent risks, common
// practice; [P] ADA Code 1.A and UK GDC Standards 3.1).
export const DEFAULT_SECTIONS_FR: TemplateSection[] = [
  {
    key: "procedure",
    heading: "Ce qui sera fait",
    body: paragraphs(
      "Votre dentiste, {dentist}, vous propose {crown} pour votre dent {tooth}. Une couronne est une coiffe qui recouvre toute la partie visible de la dent. La vôtre sera faite en {material} (finition {mode}) au cours d'un seul rendez-vous, le {date}, à {clinic}.",
      "Pendant le rendez-vous, le dentiste engourdit la dent par une injection d'anesthésique local, enlève la carie et l'ancienne obturation, puis façonne la dent pour que la couronne s'y ajuste. Une caméra balaie la dent au lieu d'une empreinte en pâte. La couronne est conçue à l'écran, puis taillée dans un bloc plein par une usineuse à la clinique. Certains matériaux sont ensuite chauffés dans un four pour atteindre leur pleine résistance. Le dentiste fait l'essai de la couronne, ajuste votre occlusion et la fixe en place avec un ciment dentaire.",
      "Selon notre estimation pour votre dent, votre matériau et votre finition, le rendez-vous dure {length}. Il peut se prolonger le jour même. Vous pouvez vous reposer ou quitter le fauteuil pendant la fabrication de la couronne.",
    ),
  },
  {
    key: "benefits",
    heading: "En quoi une couronne peut vous aider",
    body: paragraphs(list(
      "Elle protège ce qui reste d'une dent affaiblie ou fissurée contre une fracture.",
      "Elle vous permet de mastiquer normalement de ce côté.",
      "Elle redonne à la dent sa forme et sa couleur.",
      "{visits}",
    )),
  },
  {
    key: "risks",
    heading: "Risques",
    body: paragraphs(
      "La plupart des couronnes se passent bien, mais toute couronne comporte certains risques. Veuillez les lire attentivement.",
      list(
        "Le façonnage de la dent enlève une partie de la structure saine de la dent, et cela est irréversible.",
        "L'anesthésique local engourdit la lèvre, la langue ou la joue pendant quelques heures. Rarement, l'engourdissement ou les picotements durent plus longtemps.",
        "La dent peut être sensible au chaud et au froid pendant quelques jours ou quelques semaines.",
        "Le nerf de la dent peut s'enflammer, même des mois plus tard. La dent pourrait alors avoir besoin d'un traitement de canal ou, rarement, d'une extraction.",
        "Une couronne peut s'écailler ou se fracturer.",
        "Une couronne peut se décoller et devoir être refixée.",
        "Votre occlusion pourrait nécessiter de petits ajustements après le rendez-vous.",
        "La gencive autour de la couronne peut être douloureuse ou irritée pendant un certain temps.",
        "Rarement, une personne réagit à un matériau ou à un ciment utilisé (allergie).",
        "Les couronnes ne durent pas toujours. Plusieurs durent dix ans ou plus avec de bons soins et des examens réguliers.",
      ),
    ),
  },
  {
    key: "material",
    heading: "Votre matériau : {material}",
    body: "Votre dentiste a vérifié que le matériau {material} convient à votre dent. Chaque matériau a ses compromis. Voici les mises en garde pour {material} :",
  },
  {
    key: "alternatives",
    heading: "Autres options, y compris l'absence de traitement",
    body: paragraphs(
      "Vous n'êtes pas obligé(e) de recevoir cette couronne. Vos autres options sont :",
      list(
        "Une couronne fabriquée par un laboratoire dentaire en deux rendez-vous : au premier, la dent est façonnée et une couronne temporaire est posée; au deuxième, habituellement une à trois semaines plus tard, la couronne définitive est fixée en place.",
        "Un autre matériau de couronne, si votre dentiste vous en a proposé plus d'un.",
        "Une grosse obturation ou une couronne partielle (un onlay), s'il reste assez de structure dentaire. Elle pourrait moins bien protéger une dent fissurée.",
        "L'extraction de la dent, puis possiblement son remplacement par un implant, un pont ou une prothèse amovible, ou le maintien d'un espace.",
        "Aucun traitement pour le moment. La dent pourrait se fissurer davantage, devenir douloureuse ou s'infecter, et nécessiter plus tard un traitement de canal ou une extraction. Demandez à votre dentiste quelle est la probabilité pour votre dent.",
      ),
    ),
  },
  {
    key: "costs",
    heading: "Coûts",
    body: paragraphs(
      "Les honoraires pour cette couronne sont de {fee}. Ils couvrent le rendez-vous, la couronne et sa pose.",
      "Si la dent a besoin d'autres soins, par exemple un traitement de canal, ceux-ci sont facturés à part et le dentiste en discutera d'abord avec vous. Renseignez-vous auprès de la clinique si vous voulez vérifier ce que couvre votre assurance.",
    ),
  },
  {
    key: "questions",
    heading: "Vos questions",
    body: paragraphs(
      "Vous pouvez poser toutes vos questions sur ce traitement à votre dentiste avant de signer, et de nouveau à la clinique avant le début du traitement. Votre dentiste passera en revue ce consentement avec vous au fauteuil.",
      "Vous pouvez changer d'idée en tout temps avant le début du traitement, même après avoir signé : retirez votre consentement dans le portail ou avisez la clinique.",
    ),
  },
];
