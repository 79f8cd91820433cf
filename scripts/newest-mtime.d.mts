// Types of newest-mtime.mjs (plain JavaScript so `npm start` needs no TypeScript loader).
export function newestMtime(p: string): number;
