export { AnalysisWorkbench } from "./analysis-workbench";
export type { AnalysisWorkbenchProps, UnitPreferences, AnalysisLabels, PressureLimits, CompareTarget } from "./types";
