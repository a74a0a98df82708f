/** Parley's mark: a P on slate with an amber contact dot. */
export function ParleyMark({ className }: { className?: string }) {
  return (
    <svg aria-hidden="true" viewBox="0 0 32 32" className={className}>
      <rect width="32" height="32" rx="7" className="fill-slate-950" />
      <path d="M9 23V9h7.5a4.5 4.5 0 0 1 0 9H13" fill="none" className="stroke-amber-400" strokeWidth="3" strokeLinecap="round" strokeLinejoin="round" />
      <circle cx="22.5" cy="22.5" r="2" className="fill-amber-400" />
    </svg>
  );
}
