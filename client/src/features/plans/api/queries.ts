import { conformanceChecksQuery } from "./conformance-checks";
import { diffQuery } from "./diff-revisions";
import { planQuery } from "./get-plan";
import { revisionQuery } from "./get-revision";
import { listPlansQuery } from "./list-plans";
import { planOwnersQuery } from "./list-owners";
import { planSettingsQuery } from "./plan-settings";
import { reviewQueueQuery } from "./review-queue";
import { verifyQuery } from "./verify-revision";

/** The plans feature's query factory: `useQuery(plansQueries.detail(id))`. */
export const plansQueries = {
  list: listPlansQuery,
  detail: planQuery,
  revision: revisionQuery,
  verify: verifyQuery,
  diff: diffQuery,
  settings: planSettingsQuery,
  owners: planOwnersQuery,
  reviewQueue: reviewQueueQuery,
  conformanceChecks: conformanceChecksQuery,
};
