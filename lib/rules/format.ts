/** Small formatters for flag messages (display only; values in flags stay SI). */

export const num = (v: number, digits = 3): string => (Math.abs(v) >= 1e4 || (Math.abs(v) < 1e-2 && v !== 0) ? v.toExponential(digits - 1) : v.toPrecision(digits));
export const um = (m: number): string => `${(m * 1e6).toPrecision(3)} µm`;
export const mm = (m: number): string => `${(m * 1e3).toPrecision(3)} mm`;
export const kPa = (pa: number): string => `${(pa / 1e3).toPrecision(3)} kPa (${(pa / 100).toPrecision(3)} mbar)`;
export const pa = (v: number): string => `${v.toPrecision(3)} Pa`;
