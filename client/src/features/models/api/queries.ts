import { getModelQuery } from "./get-model";
import { listModelsQuery } from "./list-models";

/** The model-profile query factory: `useQuery(modelsQueries.detail(id))`. */
export const modelsQueries = {
  list: listModelsQuery,
  detail: getModelQuery,
};
