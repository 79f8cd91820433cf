import { keepPreviousData, queryOptions } from "@tanstack/react-query";
import { mailViewSchema } from "@shared/schemas/mail";
import { apiClient } from "@/lib/api-client";
import { apiPaths } from "@/config/paths";
import { mailKeys } from "./keys";

export const fetchMail = (q: string, signal?: AbortSignal) =>
  apiClient.get(apiPaths.mail({ q }), mailViewSchema, signal);

/** What the local sink received (searched by subject or recipient) and the outbox, newest first. */
export const mailViewQuery = (q: string) =>
  queryOptions({
    queryKey: mailKeys.view(q),
    queryFn: ({ signal }) => fetchMail(q, signal),
    placeholderData: keepPreviousData,
    staleTime: 0,
  });
