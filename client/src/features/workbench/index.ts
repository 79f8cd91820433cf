/**
 * What routes compose from the workbench. The chart components take an AnalysisResponse (POST /api/analyses)
 * and can be placed on any page, e.g. a plan's.
 */
export { Workbench } from "./components/workbench";
export { SpectrumChart } from "./charts/spectrum-chart";
export { RatioChart } from "./charts/ratio-chart";
export { DecayChart } from "./charts/decay-chart";
export { BoundsPanel } from "./components/bounds-panel";
export { PairTable } from "./components/pair-table";
export { MethodSummaries } from "./components/method-summaries";
export { ExportBlock } from "./components/export-block";
export { HowComputed } from "./explain/how-computed";
export { TOPICS, METHOD_TOPICS, CAUTION, type TopicId } from "./explain/topics";
export { METHOD_LABELS } from "./state/method-fields";
export { methodColour, BAND_STYLE, FLAG_STYLE } from "./charts/palette";
export { workbenchSearch } from "./state/url-codec";
