/**
 * The tee-splitter fixture (tests/fixtures/layouts/tee-um-r2000.dxf, ports A, B, C) as the
 * review, report and chip tests drive it: its layer mapping and an operating-point form.
 * At 2000 µL/min into A the inlet needs ~290 kPa (rectangular-channel resistance, Bruus 2008,
 * with IAPWS water at 25 °C), above a 2 bar pump and the PDMS plasma-bond limit: two block flags.
 */
export const TEE = "tee-um-r2000.dxf";

export const TEE_LAYERS = {
  FLOW: { role: "channel", depth: "50 um", width: "100 um" },
  PORTS: { role: "port" },
  DIE: { role: "outline" },
  TEXT: { role: "ignore" },
} as const;

/** An operating-point form: `flow` into A, B and C open at 0 mbar, water at 25 °C, a 2 bar pump, PDMS. */
export const teeForm = (name: string, flow: string) => ({
  name,
  fluid: "preset:water",
  temperature: "25 degC",
  process: "pdms_soft_lithography",
  pumpMaxPressure: "2 bar",
  ports: [
    { name: "A", drive: "flow", value: flow },
    { name: "B", drive: "pressure", value: "0 mbar" },
    { name: "C", drive: "pressure", value: "0 mbar" },
  ],
});

/** Flag keys (code|target kind|target id) of the two block flags a hard drive raises. */
export const BOND_FLAG = "pressure_bond|port|A";
export const PUMP_FLAG = "pump_pressure_max|port|A";
