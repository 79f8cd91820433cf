// Public face of the plans feature: other features and server/app.ts import only from here.
export { plansUsingModel } from "./plans.usage";
export { plansFeature } from "./plans.router";
export { conformanceFeature } from "./conformance.router";
// For the evidence feature: the revision it attaches to, its rules and mail, the signing key and the latest probe check.
export { mustPlan, mustRevision } from "./plans.service";
export { fingerprintOfRow, type RevisionContent } from "./revision-content";
export { signingKey, signPayload } from "./signing";
export { checkedProofs, proofPayload } from "./proofs";
export { notify } from "./notify";
export { activeUsersWithRole, userRef, touchPlan, type PlanRow, type RevisionRow } from "./plans.repo";
export { checksOfPlan } from "./conformance.repo";
