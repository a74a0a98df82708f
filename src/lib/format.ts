const pad2 = (value: number) => String(value).padStart(2, '0');

/** Local date and time as `YYYY-MM-DD HH:mm` (sorts and reads the same everywhere). */
export function formatDateTime(iso: string | null | undefined): string {
  if (!iso) return '—';
  const date = new Date(iso);
  if (Number.isNaN(date.getTime())) return '—';
  return `${date.getFullYear()}-${pad2(date.getMonth() + 1)}-${pad2(date.getDate())} ${pad2(date.getHours())}:${pad2(date.getMinutes())}`;
}

/** Seconds included, for logs where order within a minute matters. */
export function formatDateTimeSeconds(iso: string | null | undefined): string {
  if (!iso) return '—';
  const date = new Date(iso);
  if (Number.isNaN(date.getTime())) return '—';
  return `${formatDateTime(iso)}:${pad2(date.getSeconds())}`;
}
