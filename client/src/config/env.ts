/** Build-time settings. The API is served from the same origin by default (the server hosts the built client). */
export const env = {
  apiBase: (import.meta.env.VITE_API_BASE as string | undefined) ?? "",
  isDev: import.meta.env.DEV,
} as const;
