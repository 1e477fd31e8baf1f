/**
 * Fabrication process profiles: the limits a layout is checked against when the
 * conditions name a process. Each value carries its source, or "common practice"
 * where it has none; REFERENCES §6 lists the published ones. Exported so the app
 * can show them and store per-workspace overrides.
 */
import type { SectionShape } from "../network/types";
import { ConditionsError } from "../errors";

export type MaskType = "transparency" | "film" | "chrome";

export interface ProcessProfile {
  id: string;
  label: string;
  description: string;
  /** Smallest reliable line width by photomask (or tool) class, m. */
  minFeatureM: Record<MaskType, number>;
  defaultMask: MaskType;
  /** Smallest reliable gap between neighbouring channels, by mask class, m. */
  minSpacingM: Record<MaskType, number>;
  /** Smallest depth/width before a wide shallow roof sags or collapses; null when the lid is rigid. */
  minAspect: number | null;
  /** Largest depth/width the process makes; `maxAspectSeverity` "block" where deeper is geometrically impossible. */
  maxAspect: number | null;
  maxAspectSeverity: "warn" | "block";
  /** Largest wall height/wall width before thin walls between channels lean or collapse; null when walls are rigid. */
  maxWallAspect: number | null;
  /** Working-pressure limit set by the bond, Pa gauge. */
  maxWorkingPressurePa: number;
  /** Cross-section the process makes. */
  section: SectionShape;
  /** Other sections the process can also make. */
  alsoSections: SectionShape[];
  /** Margin between channels or ports and the die edge, m. */
  edgeMarginM: number;
  sources: Record<"minFeature" | "minSpacing" | "minAspect" | "maxAspect" | "maxWallAspect" | "maxWorkingPressure" | "section" | "edgeMargin", string>;
}

const MASK_SOURCE =
  "transparency ≥ 20 µm (Qin, Xia & Whitesides, Adv. Mater. 8, 917 (1996)); photoplotted film ≥ 8 µm (Linder et al., Anal. Chem. 75, 2522 (2003), from memory); chrome ≈ 1 µm (standard practice, from memory)";
const MASKS = { transparency: 20e-6, film: 8e-6, chrome: 1e-6 };

export const PROCESS_PROFILES: Record<string, ProcessProfile> = {
  pdms_soft_lithography: {
    id: "pdms_soft_lithography",
    label: "PDMS soft lithography (SU-8 mould, plasma bond to glass)",
    description: "PDMS replica moulded on an SU-8 master and bonded to glass after oxygen plasma.",
    minFeatureM: MASKS,
    defaultMask: "transparency",
    minSpacingM: MASKS,
    minAspect: 0.1,
    maxAspect: 5,
    maxAspectSeverity: "warn",
    maxWallAspect: 4,
    maxWorkingPressurePa: 200e3,
    section: "rectangular",
    alsoSections: ["semicircular"],
    edgeMarginM: 2e-3,
    sources: {
      minFeature: MASK_SOURCE,
      minSpacing: `${MASK_SOURCE}; gaps taken equal to lines (common practice)`,
      minAspect:
        "Delamarche et al., Adv. Mater. 9, 741 (1997): PDMS lines with h/w < 0.2 gave no useful stamps; a roof bonded to glass tolerates about half that (0.1, common practice)",
      maxAspect: "SU-8 mould lines taller than ~5× their width tend to fall over (common practice)",
      maxWallAspect: "Roca-Cusachs et al., Langmuir 21, 5542 (2005): PDMS posts collapse at aspect ratio 2–4; walls bonded along their length take the upper value",
      maxWorkingPressure:
        "PDMS–glass plasma bond bursts at ≈ 200–500 kPa (Bhattacharya et al., JMEMS 14, 590 (2005); McDonald et al., Electrophoresis 21, 27 (2000) quote 30–50 psi; numbers from memory): the low end",
      section: "SU-8 moulds give vertical walls (common practice)",
      edgeMargin: "room for punching ports and cutting the slab (common practice)",
    },
  },
  glass_wet_etch: {
    id: "glass_wet_etch",
    label: "Glass, isotropic HF wet etch (thermal bond)",
    description: "Glass etched in HF through a chrome/resist mask, thermally bonded to a glass lid.",
    minFeatureM: MASKS,
    defaultMask: "chrome",
    minSpacingM: MASKS,
    minAspect: null,
    maxAspect: 0.5,
    maxAspectSeverity: "block",
    maxWallAspect: null,
    maxWorkingPressurePa: 1e6,
    section: "isotropic_etch",
    alsoSections: [],
    edgeMarginM: 1e-3,
    sources: {
      minFeature: `${MASK_SOURCE}; the etched width is the mask line plus twice the depth`,
      minSpacing: `${MASK_SOURCE}; gaps taken equal to lines (common practice)`,
      minAspect: "rigid glass lid: no roof sag",
      maxAspect: "isotropic etch: W = W_mask + 2d, so depth ≤ width/2 (Iliescu et al., Biomicrofluidics 6, 016505 (2012); geometry)",
      maxWallAspect: "rigid glass walls",
      maxWorkingPressure: "thermally bonded glass holds well above 1 MPa; 1 MPa as a working limit (common practice)",
      section: "isotropic etch gives a flat floor and quarter-circle walls (Iliescu et al. 2012)",
      edgeMargin: "dicing margin (common practice)",
    },
  },
  silicon_koh: {
    id: "silicon_koh",
    label: "Silicon (100), KOH anisotropic etch (anodic bond to glass)",
    description: "Si(100) etched in KOH, {111} sidewalls at 54.74°, anodically bonded to a glass lid.",
    minFeatureM: MASKS,
    defaultMask: "chrome",
    minSpacingM: MASKS,
    minAspect: null,
    maxAspect: Math.tan(Math.acos(1 / Math.sqrt(3))) / 2,
    maxAspectSeverity: "block",
    maxWallAspect: null,
    maxWorkingPressurePa: 1e6,
    section: "trapezoid_koh",
    alsoSections: [],
    edgeMarginM: 1e-3,
    sources: {
      minFeature: MASK_SOURCE,
      minSpacing: `${MASK_SOURCE}; gaps taken equal to lines (common practice)`,
      minAspect: "rigid lid: no roof sag",
      maxAspect: "the {111} walls meet at depth W·tan(54.74°)/2 = 0.707 W (Petersen, Proc. IEEE 70, 420 (1982); Seidel et al. 1990)",
      maxWallAspect: "rigid silicon walls",
      maxWorkingPressure: "anodic silicon–glass bonds hold MPa-level pressure; 1 MPa as a working limit (common practice)",
      section: "KOH on Si(100) gives a trapezoid with 54.74° walls",
      edgeMargin: "dicing margin (common practice)",
    },
  },
  silicon_drie: {
    id: "silicon_drie",
    label: "Silicon, deep reactive-ion etch (anodic bond to glass)",
    description: "Silicon etched by DRIE with near-vertical walls, anodically bonded to a glass lid.",
    minFeatureM: MASKS,
    defaultMask: "chrome",
    minSpacingM: MASKS,
    minAspect: null,
    maxAspect: 20,
    maxAspectSeverity: "warn",
    maxWallAspect: 20,
    maxWorkingPressurePa: 1e6,
    section: "rectangular",
    alsoSections: [],
    edgeMarginM: 1e-3,
    sources: {
      minFeature: MASK_SOURCE,
      minSpacing: `${MASK_SOURCE}; gaps taken equal to lines (common practice)`,
      minAspect: "rigid lid: no roof sag",
      maxAspect: "DRIE reaches about 20:1 before lag and profile loss dominate (common practice)",
      maxWallAspect: "free-standing silicon walls beyond ~20:1 are fragile (common practice)",
      maxWorkingPressure: "anodic silicon–glass bonds hold MPa-level pressure; 1 MPa as a working limit (common practice)",
      section: "DRIE gives near-vertical walls",
      edgeMargin: "dicing margin (common practice)",
    },
  },
  thermoplastic_milling: {
    id: "thermoplastic_milling",
    label: "Thermoplastic, CNC micromilling (thermal or solvent bond)",
    description: "PMMA, COC or PC milled with end mills and bonded to a cover sheet.",
    minFeatureM: { transparency: 50e-6, film: 50e-6, chrome: 50e-6 },
    defaultMask: "chrome",
    minSpacingM: { transparency: 50e-6, film: 50e-6, chrome: 50e-6 },
    minAspect: 0.05,
    maxAspect: 3,
    maxAspectSeverity: "warn",
    maxWallAspect: 5,
    maxWorkingPressurePa: 500e3,
    section: "rectangular",
    alsoSections: ["semicircular"],
    edgeMarginM: 2e-3,
    sources: {
      minFeature: "smallest practical end mill ≈ 50 µm (common practice); a mask does not apply",
      minSpacing: "walls thinner than ≈ 50 µm chip or deform under the cutter (common practice)",
      minAspect: "thin cover sheets sag into wide shallow channels during thermal bonding (common practice)",
      maxAspect: "cutter length limits depth to about 3× the tool diameter (common practice)",
      maxWallAspect: "thin tall plastic walls deflect under the cutter (common practice)",
      maxWorkingPressure: "thermally bonded thermoplastic chips typically hold several hundred kPa (common practice, from memory)",
      section: "flat end mills give vertical walls; ball mills give rounded floors",
      edgeMargin: "clamping and bonding margin (common practice)",
    },
  },
  thermoplastic_embossing: {
    id: "thermoplastic_embossing",
    label: "Thermoplastic, hot embossing (thermal bond)",
    description: "PMMA or COC embossed from a silicon or nickel master and thermally bonded.",
    minFeatureM: { transparency: 20e-6, film: 10e-6, chrome: 10e-6 },
    defaultMask: "chrome",
    minSpacingM: { transparency: 20e-6, film: 10e-6, chrome: 10e-6 },
    minAspect: 0.05,
    maxAspect: 2,
    maxAspectSeverity: "warn",
    maxWallAspect: 2,
    maxWorkingPressurePa: 500e3,
    section: "rectangular",
    alsoSections: [],
    edgeMarginM: 2e-3,
    sources: {
      minFeature: "master-limited; ≈ 10 µm for routine embossing (common practice)",
      minSpacing: "≈ 10 µm for routine embossing (common practice)",
      minAspect: "cover sheets sag into wide shallow channels during thermal bonding (common practice)",
      maxAspect: "demoulding tears features deeper than about 2× their width (common practice)",
      maxWallAspect: "tall thin embossed walls tear on demoulding (common practice)",
      maxWorkingPressure: "thermally bonded thermoplastic chips typically hold several hundred kPa (common practice, from memory)",
      section: "embossing copies the master's vertical walls",
      edgeMargin: "clamping and bonding margin (common practice)",
    },
  },
};

/**
 * Look up a process profile by id.
 * @throws ConditionsError naming the known processes when the id is unknown.
 */
export function requireProcess(id: string): ProcessProfile {
  const p = PROCESS_PROFILES[id];
  if (!p) {
    throw new ConditionsError("unknown_process", `process "${id}" is not a profile Stokeline knows; use one of ${Object.keys(PROCESS_PROFILES).join(", ")}.`);
  }
  return p;
}

/** List the process profiles for the app. */
export function listProcesses(): ProcessProfile[] {
  return Object.values(PROCESS_PROFILES);
}
