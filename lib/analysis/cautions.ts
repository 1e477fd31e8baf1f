/** The model's limits and the usual cautions, shown wherever results are shown or exported. */
export const MODEL_CAUTIONS: readonly string[] = [
  "These figures come from a lumped model of fully developed, laminar, single-phase flow in rigid channels: entrance effects, channel compliance, droplets' own resistance, electrokinetics and non-Newtonian fluids are not modelled.",
  "Pressurised chips can delaminate or burst. Stay below the bond strength your fab has measured for your process, and ramp pressure with shielding and eye protection.",
  "Biological samples are handled under your lab's biosafety rules; wall-shear figures are estimates, not a guarantee that cells survive.",
  "Verify critical designs by experiment or a full flow simulation, and defer to local codes, your fab's own design rules and licensed engineering practice.",
];
