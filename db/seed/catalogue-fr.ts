// The default catalogue's patient-facing texts in Canadian French, by material key (generic names
// only). The clinic manager can change them per language like the English ones.
import type { MaterialTexts } from "@/db/models/material";

export const CATALOGUE_FR: Record<string, MaterialTexts & { name: string }> = {
  zirconia: {
    name: "Zircone",
    description: "Une céramique très résistante, de la couleur des dents. Elle est usinée légèrement plus grande, puis chauffée dans le four de la clinique, où elle rétrécit jusqu'à sa taille et sa dureté finales.",
    pros: ["L'option la plus résistante : convient aux dents du fond et aux personnes qui serrent des dents", "Demande d'enlever le moins de dent saine", "Peut être fixée avec un ciment à couronne ordinaire"],
    cautions: ["Un peu plus opaque que les vitrocéramiques, ce qui compte surtout pour les dents d'en avant", "Ajoute du temps de four au rendez-vous", "Difficile à percer si la dent a besoin plus tard d'un traitement de canal"],
  },
  "lithium-disilicate": {
    name: "Disilicate de lithium",
    description: "Une vitrocéramique à l'aspect très naturel. Elle est meulée dans un bloc, puis cuite une fois au four pour atteindre sa pleine résistance et sa couleur.",
    pros: ["Aspect très naturel et translucide", "Assez résistante pour la plupart des couronnes unitaires", "Se colle bien à la dent"],
    cautions: ["Demande de réduire la dent davantage que la zircone", "Moins indiquée pour les personnes qui grincent ou serrent fortement des dents", "Ajoute au rendez-vous une cuisson d'environ une demi-heure"],
  },
  "leucite-glass-ceramic": {
    name: "Vitrocéramique renforcée à la leucite",
    description: "Une vitrocéramique au lustre naturel, meulée dans un bloc puis polie. Elle ne demande pas de four, donc le rendez-vous est plus court.",
    pros: ["Aspect très naturel pour les dents d'en avant et du milieu", "Pas de temps de four", "Douce pour les dents opposées"],
    cautions: ["Ne convient pas aux molaires ni aux fortes forces de morsure", "Doit être collée avec un ciment adhésif", "Peut s'écailler si vous mordez des objets très durs"],
  },
  "feldspathic-ceramic": {
    name: "Céramique feldspathique",
    description: "Une porcelaine à grain fin, meulée dans un bloc puis polie. Elle s'use à peu près comme l'émail naturel.",
    pros: ["S'use comme l'émail naturel", "Facile à ajuster et à polir", "Pas de temps de four"],
    cautions: ["L'option la plus fragile : dents d'en avant et du milieu seulement", "Doit être collée avec un ciment adhésif", "Demande assez de structure dentaire pour le collage"],
  },
  "resin-ceramic-hybrid": {
    name: "Hybride résine-céramique",
    description: "Un mélange de céramique et de résine, usiné puis poli. Il est un peu plus tendre et ménage les dents contre lesquelles il mord.",
    pros: ["Rapide : pas de four", "Ménage les dents opposées", "Facile à réparer en bouche"],
    cautions: ["Contient des résines méthacryliques : signalez-nous toute allergie aux résines ou aux acryliques", "Peut se tacher ou s'user plus vite qu'une céramique pure", "Doit être collé avec un ciment adhésif"],
  },
  pmma: {
    name: "PMMA (provisoire)",
    description: "Une résine acrylique pour une couronne temporaire, portée pendant la planification d'une couronne définitive. Elle n'est pas faite pour durer.",
    pros: ["Rapide à fabriquer", "Protège la dent pendant la planification d'une couronne définitive"],
    cautions: ["Temporaire seulement : elle s'use et peut se briser", "Contient une résine méthacrylique : signalez-nous toute allergie aux résines ou aux acryliques", "Une couronne définitive reste nécessaire"],
  },
};
