import type { RevisionValues } from "../../../shared/schemas";
import type { ModelSnapshot } from "../../../shared/schemas/plans";
import { DROPS_SHIPPED, lineageOf, startLength } from "../../../shared/lineage";

const tokens = (n: number) => n.toLocaleString("en-US");

/**
 * Field-named problems with where a plan starts and how its stages chain (shared/lineage.ts):
 * - only a model that ships scaling has a served length to extend from;
 * - extending from it, the target is at least that length, and a method that rebuilds the frequencies from the bare
 *   base (no rescaling, a new base) would silently drop the shipped scaling;
 * - each stage trains from where the previous one ended, so stage targets never go back.
 */
export function lineageIssues(model: ModelSnapshot, v: RevisionValues): Record<string, string> {
  const fields: Record<string, string> = {};
  const l = lineageOf(model);
  const served = v.extendsFrom === "served";
  if (served && !l) {
    fields.extendsFrom =
      "this model ships no scaling, so its served length is its pre-trained length: extend from that";
    return fields;
  }
  const start = l ? startLength(l, v.extendsFrom) : model.trainedContext;
  const startName = served ? "served length" : "pre-trained length";
  const dropsShipped = (method: string) =>
    `${method} rebuilds the frequencies from the bare base and would drop the shipped scaling; extending from the served length needs a scaling method (or as shipped)`;
  if (served && v.targetContext < start)
    fields.targetContext = `below the ${startName} ${tokens(start)} this plan extends from`;
  if (served && DROPS_SHIPPED.includes(v.method.method)) fields["method.method"] = dropsShipped(v.method.method);
  let previous = start;
  v.stages.forEach((s, i) => {
    if (s.targetContext < previous) {
      fields[`stages.${i}.targetContext`] =
        i === 0
          ? `below the ${startName} ${tokens(previous)} the plan extends from`
          : `below stage ${i}'s target ${tokens(previous)}: each stage trains from where the previous one ended`;
    }
    if (served && DROPS_SHIPPED.includes(s.method.method))
      fields[`stages.${i}.method.method`] = dropsShipped(s.method.method);
    previous = Math.max(previous, s.targetContext);
  });
  return fields;
}
