/** Links the browser downloads directly (the server sets Content-Disposition on each). */
export const traceDownloads = {
  original: (id: string | number) => `/api/traces/${encodeURIComponent(String(id))}/download`,
  report: (id: string | number) => `/api/traces/${encodeURIComponent(String(id))}/report.json`,
  vector: (id: string | number) => `/api/traces/${encodeURIComponent(String(id))}/vector`,
};
