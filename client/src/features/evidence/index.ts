/** What routes compose from the evidence feature. */
export { EvidenceSection } from "./components/evidence-section";
