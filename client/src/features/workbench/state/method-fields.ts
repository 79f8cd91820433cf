import { METHOD_CATALOG, METHOD_IDS, type MethodId } from "@shared/methods";

export { defaultText, methodEntry, type FieldContext, type ParamField as MethodField } from "@shared/methods";

/** Names for the method picker and the legends: the catalog's, so the plan editor shows the same ones. */
export const METHOD_LABELS = Object.fromEntries(METHOD_IDS.map((id) => [id, METHOD_CATALOG[id].label])) as Record<
  MethodId,
  string
>;
