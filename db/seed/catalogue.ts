// The default crown-material catalogue and stage minutes a new clinic starts with.
// Values follow docs/clinical-references.md and docs/references.md; the clinic manager edits them afterwards (they are data).
// Sources: [P] published, [M] from memory, [C] common practice, no source.
import type { Cementation, Fabrication, FinishingKind, HeatTreatment, Mode, StageKey, ToothClass } from "@/lib/domain/types";

export type CatalogueMaterial = {
  key: string;
  name: string;
  iso6872Class: number | null;
  flexuralStrengthMpa: number | null;
  toothClasses: ToothClass[];
  cementation: Cementation[];
  fabrication: Fabrication;
  heatTreatment: HeatTreatment;
  minThicknessMm: number;
  provisionalOnly?: boolean;
  /** The visit's stages in order; the glaze firing applies only to a stain-and-glaze finish. */
  stageOrder: StageKey[];
  description: string;
  pros: string[];
  cautions: string[];
  modes: { mode: Mode; fabricationMinutes: number; heatTreatmentMinutes: number; finishing: FinishingKind; finishingMinutes: number; glazeFiringMinutes: number }[];
};

const CHAIR_START: StageKey[] = ["check_in", "anaesthesia", "preparation", "scan", "design"];

/** [C] Stage orders from common chairside practice (REFERENCES.md, "Second wave"). */
export const STAGE_ORDERS = {
  // Mill → sinter → stain and glaze then a glaze firing, or polish → try-in → cement.
  sintered: [...CHAIR_START, "fabrication", "heat_treatment", "finishing", "glaze_firing", "try_in", "cementation", "aftercare"],
  // Grind → try-in while pre-crystallised → stain and glaze → one crystallisation-and-glaze firing → cement.
  crystallised: [...CHAIR_START, "fabrication", "try_in", "finishing", "heat_treatment", "cementation", "aftercare"],
  // Grind → try-in → polish, or stain and glaze with an optional glaze firing → cement.
  glassCeramic: [...CHAIR_START, "fabrication", "try_in", "finishing", "glaze_firing", "cementation", "aftercare"],
  // Mill → try-in → polish → cement; never fired.
  resin: [...CHAIR_START, "fabrication", "try_in", "finishing", "cementation", "aftercare"],
} satisfies Record<string, StageKey[]>;

export const CATALOGUE: CatalogueMaterial[] = [
  {
    key: "zirconia",
    name: "Zirconia",
    // [M] high-strength zirconia sits in ISO 6872 class 5 (≥ 800 MPa).
    iso6872Class: 5,
    flexuralStrengthMpa: 900,
    toothClasses: ["anterior", "premolar", "molar"],
    cementation: ["adhesive", "conventional"],
    // [P] milled dry from an oversized pre-sintered blank, then sintered (Materials 2022;15(7):2478).
    fabrication: "dry_milling",
    heatTreatment: "sintering",
    // [P] 0.5 mm survived loading in vitro (Weigl 2018); [M] clinical minimum 0.5–1.0 mm.
    minThicknessMm: 0.8,
    stageOrder: STAGE_ORDERS.sintered,
    description: "A very strong, tooth-coloured ceramic. It is milled slightly oversized and then heated in the clinic's furnace, where it shrinks to its final size and hardness.",
    pros: ["The strongest option: suits back teeth and people who clench", "Needs the least removal of healthy tooth", "Can be fixed with ordinary crown cement"],
    cautions: ["Looks a little more opaque than glass ceramics, which matters most for front teeth", "Adds furnace time to the visit", "Hard to cut through if the tooth later needs a root canal treatment"],
    modes: [
      // [C] in the fastest mode a zirconia single crown is milled in about 5 minutes;
      // [P] speed sintering dwell: super-speed 10 min, speed 25 min (Kaizer et al. 2017); heating and cooling add to it.
      // [C] a glaze firing takes roughly 10–20 minutes; the stains and glaze are painted on first.
      { mode: "rapid", fabricationMinutes: 5, heatTreatmentMinutes: 20, finishing: "polish", finishingMinutes: 10, glazeFiringMinutes: 0 },
      { mode: "standard", fabricationMinutes: 12, heatTreatmentMinutes: 35, finishing: "stain_glaze", finishingMinutes: 5, glazeFiringMinutes: 15 },
      { mode: "refined", fabricationMinutes: 18, heatTreatmentMinutes: 40, finishing: "stain_glaze", finishingMinutes: 8, glazeFiringMinutes: 15 },
    ],
  },
  {
    key: "lithium-disilicate",
    name: "Lithium disilicate",
    // [M] about 360–400 MPa: ISO 6872 class 3 (≥ 300 MPa).
    iso6872Class: 3,
    flexuralStrengthMpa: 370,
    toothClasses: ["anterior", "premolar", "molar"],
    cementation: ["adhesive", "conventional"],
    // [P] ground wet in a partly crystallised state, then fired at about 840–850 °C (Lohbauer 2019).
    fabrication: "wet_grinding",
    heatTreatment: "crystallisation",
    // [M] occlusal 1.5 mm, axial 1.0–1.2 mm minimum.
    minThicknessMm: 1.5,
    stageOrder: STAGE_ORDERS.crystallised,
    description: "A glass ceramic that looks very natural. It is ground from a block and then fired once in the furnace to reach its full strength and colour.",
    pros: ["Very natural, translucent look", "Strong enough for most single crowns", "Bonds well to the tooth"],
    cautions: ["Needs more tooth reduction than zirconia", "Less suited to people who grind or clench heavily", "Adds a firing of about half an hour to the visit"],
    modes: [
      // [M] crystallisation firing cycle 20–30 min.
      // [C] crystallisation and glaze often fired together, roughly 15–30 min: every mode is stained and glazed before that one firing.
      { mode: "rapid", fabricationMinutes: 10, heatTreatmentMinutes: 20, finishing: "stain_glaze", finishingMinutes: 5, glazeFiringMinutes: 0 },
      { mode: "standard", fabricationMinutes: 14, heatTreatmentMinutes: 25, finishing: "stain_glaze", finishingMinutes: 8, glazeFiringMinutes: 0 },
      { mode: "refined", fabricationMinutes: 20, heatTreatmentMinutes: 30, finishing: "stain_glaze", finishingMinutes: 12, glazeFiringMinutes: 0 },
    ],
  },
  {
    key: "leucite-glass-ceramic",
    name: "Leucite-reinforced glass ceramic",
    // [M] about 160 MPa: ISO 6872 class 2 (≥ 100 MPa), adhesive cementation.
    iso6872Class: 2,
    flexuralStrengthMpa: 160,
    toothClasses: ["anterior", "premolar"],
    cementation: ["adhesive"],
    fabrication: "wet_grinding",
    heatTreatment: "none",
    minThicknessMm: 1.5,
    stageOrder: STAGE_ORDERS.glassCeramic,
    description: "A glass ceramic with a lifelike sheen, ground from a block and polished. It needs no furnace, so the visit is shorter.",
    pros: ["Very natural look for front and middle teeth", "No furnace time", "Gentle on the opposing teeth"],
    cautions: ["Not for back molars or heavy biting forces", "Must be bonded with adhesive cement", "Can chip if you bite very hard objects"],
    modes: [
      { mode: "rapid", fabricationMinutes: 10, heatTreatmentMinutes: 0, finishing: "polish", finishingMinutes: 10, glazeFiringMinutes: 0 },
      { mode: "standard", fabricationMinutes: 14, heatTreatmentMinutes: 0, finishing: "polish", finishingMinutes: 12, glazeFiringMinutes: 0 },
      { mode: "refined", fabricationMinutes: 20, heatTreatmentMinutes: 0, finishing: "stain_glaze", finishingMinutes: 8, glazeFiringMinutes: 15 },
    ],
  },
  {
    key: "feldspathic-ceramic",
    name: "Feldspathic ceramic",
    // [M] about 100–150 MPa: ISO 6872 class 2 (≥ 100 MPa), adhesive cementation.
    iso6872Class: 2,
    flexuralStrengthMpa: 120,
    toothClasses: ["anterior", "premolar"],
    cementation: ["adhesive"],
    fabrication: "wet_grinding",
    heatTreatment: "none",
    // [M] 1.5–2.0 mm occlusal.
    minThicknessMm: 1.5,
    stageOrder: STAGE_ORDERS.glassCeramic,
    description: "A fine-grained porcelain ground from a block and polished. It wears much like natural enamel.",
    pros: ["Wears like natural enamel", "Easy to adjust and polish", "No furnace time"],
    cautions: ["The most fragile option: front and middle teeth only", "Must be bonded with adhesive cement", "Needs enough tooth structure to bond to"],
    modes: [
      { mode: "rapid", fabricationMinutes: 9, heatTreatmentMinutes: 0, finishing: "polish", finishingMinutes: 10, glazeFiringMinutes: 0 },
      { mode: "standard", fabricationMinutes: 12, heatTreatmentMinutes: 0, finishing: "polish", finishingMinutes: 12, glazeFiringMinutes: 0 },
      { mode: "refined", fabricationMinutes: 18, heatTreatmentMinutes: 0, finishing: "stain_glaze", finishingMinutes: 8, glazeFiringMinutes: 15 },
    ],
  },
  {
    key: "resin-ceramic-hybrid",
    name: "Resin-ceramic hybrid",
    // Not a ceramic under ISO 6872: no class.
    iso6872Class: null,
    flexuralStrengthMpa: null,
    toothClasses: ["anterior", "premolar", "molar"],
    cementation: ["adhesive"],
    fabrication: "wet_grinding",
    heatTreatment: "none",
    minThicknessMm: 1.0,
    stageOrder: STAGE_ORDERS.resin,
    description: "A blend of ceramic and resin that is milled and polished. It is a little softer and kinder to the teeth it bites against.",
    pros: ["Quick: no furnace", "Kind to opposing teeth", "Easy to repair in the mouth"],
    cautions: ["Contains methacrylate resins: tell us about any resin or acrylic allergy", "May stain or wear faster than full ceramics", "Must be bonded with adhesive cement"],
    modes: [
      { mode: "rapid", fabricationMinutes: 9, heatTreatmentMinutes: 0, finishing: "polish", finishingMinutes: 8, glazeFiringMinutes: 0 },
      { mode: "standard", fabricationMinutes: 12, heatTreatmentMinutes: 0, finishing: "polish", finishingMinutes: 10, glazeFiringMinutes: 0 },
      { mode: "refined", fabricationMinutes: 16, heatTreatmentMinutes: 0, finishing: "polish", finishingMinutes: 12, glazeFiringMinutes: 0 },
    ],
  },
  {
    key: "pmma",
    name: "PMMA (provisional)",
    // [C] provisional only, no firing; not a ceramic, no ISO 6872 class.
    iso6872Class: null,
    flexuralStrengthMpa: null,
    toothClasses: ["anterior", "premolar", "molar"],
    cementation: ["conventional"],
    fabrication: "dry_milling",
    heatTreatment: "none",
    minThicknessMm: 1.0,
    provisionalOnly: true,
    stageOrder: STAGE_ORDERS.resin,
    description: "An acrylic resin for a temporary crown, worn while a final crown is planned. It is not meant to last.",
    pros: ["Quick to make", "Protects the tooth while a final crown is planned"],
    cautions: ["Temporary only: it wears and can break", "Contains methacrylate resin: tell us about any resin or acrylic allergy", "A final crown is still needed"],
    modes: [
      { mode: "rapid", fabricationMinutes: 9, heatTreatmentMinutes: 0, finishing: "polish", finishingMinutes: 5, glazeFiringMinutes: 0 },
      { mode: "standard", fabricationMinutes: 12, heatTreatmentMinutes: 0, finishing: "polish", finishingMinutes: 8, glazeFiringMinutes: 0 },
    ],
  },
];

/** [C] Stage minutes from common practice (REFERENCES.md stage times), per clinic; tooth class overrides where given. */
export const DEFAULT_STAGE_MINUTES: { stage: string; toothClass?: "anterior" | "premolar" | "molar"; minutes: number }[] = [
  { stage: "check_in", minutes: 5 },
  { stage: "anaesthesia", minutes: 10 },
  { stage: "preparation", minutes: 25 },
  { stage: "preparation", toothClass: "anterior", minutes: 20 },
  { stage: "preparation", toothClass: "molar", minutes: 30 },
  { stage: "scan", minutes: 10 },
  { stage: "design", minutes: 15 },
  { stage: "try_in", minutes: 10 },
  { stage: "cementation", minutes: 15 },
  { stage: "aftercare", minutes: 10 },
];
