/** Physical constants, SI, exact by definition. */

/** Standard acceleration of gravity, m/s² (3rd CGPM 1901; ISO 80000-3). */
export const STANDARD_GRAVITY_M_PER_S2 = 9.80665;
/** Boltzmann constant, J/K (exact in the 2019 SI). */
export const BOLTZMANN_J_PER_K = 1.380649e-23;
/** Density of air at 20 °C and 0.1 MPa, kg/m³ (typical value), for Bond numbers at open ports. */
export const AIR_DENSITY_KG_PER_M3 = 1.204;
