import { queryOptions } from "@tanstack/react-query";
import { tokenListResponseSchema } from "@shared/schemas/tokens";
import { apiClient } from "@/lib/api-client";
import { apiPaths } from "@/config/paths";
import { tokensKeys } from "./keys";

export const fetchTokens = (signal?: AbortSignal) =>
  apiClient.get(apiPaths.tokens(), tokenListResponseSchema, signal).then((r) => r.tokens);

export const listTokensQuery = () =>
  queryOptions({ queryKey: tokensKeys.list(), queryFn: ({ signal }) => fetchTokens(signal) });
