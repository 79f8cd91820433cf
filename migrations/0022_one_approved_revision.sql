-- A plan holds at most one approved revision: approving one supersedes the others in the same transaction (the
-- supersede runs first). The plan list's proof counts rely on it. Every version of the workflow did so, so no
-- existing row conflicts; should one, this fails and names the index rather than choosing which sign-off to keep.
CREATE UNIQUE INDEX "plan_revisions_one_approved" ON "plan_revisions" USING btree ("plan_id") WHERE "plan_revisions"."state" = 'approved';