/**
 * The rule registry: every flag code Stokeline can raise, with its family,
 * default severity, default threshold, source and a plain description, so the
 * app can list the rules and let reviewers override thresholds
 * (`conditions.thresholds[code]`).
 */
import type { Conditions } from "../analysis/conditions";
import type { Flag, FlagSeverity } from "../hydraulics/types";

export interface RuleDefinition {
  code: string;
  family: Flag["family"];
  severity: FlagSeverity;
  title: string;
  description: string;
  /** Default threshold; null where the process profile or the conditions supply it. */
  defaultThreshold: number | null;
  /** Unit or meaning of the threshold. */
  thresholdUnit: string;
  /** Where the threshold comes from. */
  source: string;
  /** What the rule needs to run. */
  needs: "hydraulics" | "process" | "hydraulics+process" | "hydraulics+pump";
}

export const RULES: readonly RuleDefinition[] = [
  {
    code: "re_inertial",
    family: "regime",
    severity: "info",
    title: "Inertia no longer negligible",
    description: "Reynolds number above about 1: inertia starts to shape the flow (secondary flows in bends, particle migration), and the Stokes-flow picture is only approximate.",
    defaultThreshold: 1,
    thresholdUnit: "Re",
    source: "Di Carlo, Lab Chip 9, 3038 (2009); Zhang et al., Lab Chip (2016): inertial microfluidics spans ~1 < Re < ~100",
    needs: "hydraulics",
  },
  {
    code: "re_strongly_inertial",
    family: "regime",
    severity: "warn",
    title: "Strongly inertial flow",
    description: "Reynolds number above about 100: flow separates behind corners and at junctions, and lumped resistances underestimate the pressure needed.",
    defaultThreshold: 100,
    thresholdUnit: "Re",
    source: "Zhang et al., Lab Chip (2016), doi 10.1039/C5LC01159K: upper end of the inertial-microfluidics range",
    needs: "hydraulics",
  },
  {
    code: "re_turbulent",
    family: "regime",
    severity: "block",
    title: "Turbulent-transition Reynolds number (likely an input error)",
    description: "Reynolds number above about 2000, where pipe flow can turn turbulent. This almost never happens in microchannels; check the flow rate, the units and the channel size.",
    defaultThreshold: 2000,
    thresholdUnit: "Re",
    source: "Reynolds (1883), transition ≈ 2000; Avila et al., Science 333, 192 (2011)",
    needs: "hydraulics",
  },
  {
    code: "dean_secondary_flow",
    family: "regime",
    severity: "info",
    title: "Dean vortices in a bend",
    description: "Dean number above about 1: the bend drives a pair of counter-rotating secondary vortices that stir the stream and move particles across it.",
    defaultThreshold: 1,
    thresholdUnit: "De",
    source: "Dean (1927/28) defines De = Re√(D_h/2R_c); noticeable secondary flow from De ≈ 1 (common practice)",
    needs: "hydraulics",
  },
  {
    code: "entrance_length_share",
    family: "regime",
    severity: "info",
    title: "Flow not fully developed over much of the segment",
    description: "The entrance length is a large share of the segment, so the fully developed resistance used here underestimates its pressure drop.",
    defaultThreshold: 0.1,
    thresholdUnit: "entrance length / segment length",
    source: "entrance length by Durst et al., J. Fluids Eng. 127, 1154 (2005) (from memory); 10 % share as the threshold is common practice",
    needs: "hydraulics",
  },
  {
    code: "wall_shear_cells",
    family: "regime",
    severity: "warn",
    title: "Wall shear above a cell-safe level",
    description: "Wall shear stress above arterial level; adherent cells may detach or be activated, and fragile cells may be damaged.",
    defaultThreshold: 1.5,
    thresholdUnit: "Pa",
    source: "Malek, Alper & Izumo, JAMA 282, 2035 (1999): arterial-level shear > 15 dyn/cm² (1.5 Pa)",
    needs: "hydraulics",
  },
  {
    code: "droplet_squeezing",
    family: "regime",
    severity: "info",
    title: "Droplet break-up: squeezing regime",
    description: "Capillary number below about 0.01 where the phases meet: the dispersed thread blocks the channel and is squeezed off; droplet length is set by the flow-rate ratio.",
    defaultThreshold: 0.01,
    thresholdUnit: "Ca (upper bound of squeezing)",
    source: "Garstecki, Fuerstman, Stone & Whitesides, Lab Chip 6, 437 (2006)",
    needs: "hydraulics",
  },
  {
    code: "droplet_dripping",
    family: "regime",
    severity: "info",
    title: "Droplet break-up: dripping regime",
    description: "Capillary number between squeezing and jetting: shear pulls droplets off before they fill the channel; droplet size falls as Ca rises. Near the lower bound the regime is transitional.",
    defaultThreshold: 0.015,
    thresholdUnit: "Ca (squeezing–dripping transition)",
    source: "De Menech, Garstecki, Jousse & Stone, J. Fluid Mech. 595, 141 (2008): transition Ca* ≈ 0.015 (value from memory)",
    needs: "hydraulics",
  },
  {
    code: "droplet_jetting",
    family: "regime",
    severity: "warn",
    title: "Droplet break-up: jetting regime",
    description: "Capillary number high enough for a jet to form: droplets pinch off far downstream and sizes spread. Lower the continuous-phase flow or raise the interfacial tension.",
    defaultThreshold: 0.1,
    thresholdUnit: "Ca (lower bound of jetting)",
    source: "common practice (order of magnitude for the dripping–jetting transition)",
    needs: "hydraulics",
  },
  {
    code: "droplet_phases_untagged",
    family: "regime",
    severity: "info",
    title: "Which ports carry the second phase?",
    description: "A second phase is given but no port is marked as dispersed, so droplet junctions cannot be found. Mark the dispersed-phase inlets with \"phase\": \"dispersed\".",
    defaultThreshold: null,
    thresholdUnit: "",
    source: "common practice",
    needs: "hydraulics",
  },
  {
    code: "mixing_incomplete",
    family: "regime",
    severity: "warn",
    title: "Streams do not mix before the outlet",
    description: "Two inlet streams meet, but the channel downstream is shorter than the diffusive mixing length (≈ Pe·w), so they leave side by side. Lengthen the channel, narrow it, slow the flow, or add a passive mixer.",
    defaultThreshold: 1,
    thresholdUnit: "Σ L / (Pe·w) along the path to the outlet",
    source: "Squires & Quake, Rev. Mod. Phys. 77, 977 (2005), §III: mixing length Z ~ Pe·w",
    needs: "hydraulics",
  },
  {
    code: "pump_pressure_max",
    family: "pressure",
    severity: "block",
    title: "Pump cannot reach this pressure",
    description: "The pressure needed at this port is above the pump's maximum. Widen or shorten the channels, lower the flow, or use a stronger pump.",
    defaultThreshold: null,
    thresholdUnit: "Pa (from conditions.pump.max_pressure)",
    source: "the pump's rating, as given in the conditions",
    needs: "hydraulics+pump",
  },
  {
    code: "pressure_bond",
    family: "pressure",
    severity: "block",
    title: "Pressure above the bond's limit: burst risk",
    description: "The pressure at this port is above what the process's bond usually holds. The chip may delaminate, leak or burst, spraying liquid. Lower the pressure, or choose a stronger bond.",
    defaultThreshold: null,
    thresholdUnit: "Pa (from the process profile)",
    source: "process profile (see lib/rules/processes.ts)",
    needs: "hydraulics+process",
  },
  {
    code: "fab_min_width",
    family: "fabrication",
    severity: "block",
    title: "Channel narrower than the process can make",
    description: "The channel is narrower than the smallest feature the mask or tool resolves; it will come out wider, rough or missing. Widen it or use a finer mask.",
    defaultThreshold: null,
    thresholdUnit: "m (from the process profile and mask)",
    source: "process profile",
    needs: "process",
  },
  {
    code: "fab_min_spacing",
    family: "fabrication",
    severity: "block",
    title: "Channels too close together",
    description: "The gap between two channels is below the process's smallest reliable gap; the wall between them may not form, or channels may merge.",
    defaultThreshold: null,
    thresholdUnit: "m (from the process profile and mask)",
    source: "process profile",
    needs: "process",
  },
  {
    code: "fab_roof_collapse",
    family: "fabrication",
    severity: "warn",
    title: "Wide shallow channel: roof may sag or collapse",
    description: "Depth is small compared with width, so the roof can sag onto the floor. Add support posts, make the channel deeper or narrower.",
    defaultThreshold: null,
    thresholdUnit: "depth/width (from the process profile)",
    source: "process profile",
    needs: "process",
  },
  {
    code: "fab_aspect_max",
    family: "fabrication",
    severity: "warn",
    title: "Channel deeper than the process allows for its width",
    description: "Depth is large compared with width for this process; it may not etch, mould or demould as drawn.",
    defaultThreshold: null,
    thresholdUnit: "depth/width (from the process profile)",
    source: "process profile",
    needs: "process",
  },
  {
    code: "fab_tall_wall",
    family: "fabrication",
    severity: "warn",
    title: "Tall thin wall between channels",
    description: "The wall between two channels is tall compared with its thickness and may lean, deform or collapse. Move the channels apart or make them shallower.",
    defaultThreshold: null,
    thresholdUnit: "depth/gap (from the process profile)",
    source: "process profile",
    needs: "process",
  },
  {
    code: "fab_profile",
    family: "fabrication",
    severity: "warn",
    title: "Cross-section does not match the process",
    description: "The channel's cross-section is not what this process makes, so its computed resistance may be off. Set the layer's section to the process's profile.",
    defaultThreshold: null,
    thresholdUnit: "",
    source: "process profile",
    needs: "process",
  },
  {
    code: "fab_edge_margin",
    family: "fabrication",
    severity: "warn",
    title: "Too close to the die edge",
    description: "A channel or port is closer to the die outline than the process's margin; dicing, punching or bonding may break into it.",
    defaultThreshold: null,
    thresholdUnit: "m (from the process profile)",
    source: "process profile",
    needs: "process",
  },
  {
    code: "fab_outside_outline",
    family: "fabrication",
    severity: "block",
    title: "Outside the die outline",
    description: "Part of a channel or port lies outside the die outline and would be cut away.",
    defaultThreshold: 0,
    thresholdUnit: "m",
    source: "geometry",
    needs: "process",
  },
];

const BY_CODE = new Map(RULES.map((r) => [r.code, r]));

/** The definition of a rule code; throws on an unknown code (a programming error). */
export function ruleDefinition(code: string): RuleDefinition {
  const r = BY_CODE.get(code);
  if (!r) throw new Error(`unknown rule code ${code}`);
  return r;
}

/** The threshold in force: the conditions' override for this code, else the given default. */
export function thresholdFor(code: string, conditions: Conditions, fallback: number): number {
  const o = conditions.thresholds?.[code];
  return typeof o === "number" && Number.isFinite(o) ? o : fallback;
}

/** Make a flag from a rule definition; the title, family, default severity and source come from the registry unless given. */
export function makeFlag(code: string, f: Omit<Flag, "code" | "family" | "title" | "severity" | "source"> & Partial<Pick<Flag, "severity" | "source" | "title">>): Flag {
  const def = ruleDefinition(code);
  return {
    code,
    family: def.family,
    severity: f.severity ?? def.severity,
    title: f.title ?? def.title,
    source: f.source ?? def.source,
    target: f.target,
    message: f.message,
    value: f.value,
    threshold: f.threshold,
    ...(f.at ? { at: f.at } : {}),
  };
}
