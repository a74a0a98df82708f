/** Simulation only: the usual cautions before anyone reproduces a scenario with real power. */
export function SafetyNote() {
  return (
    <aside aria-label="Safety" className="mb-4 rounded-md border border-amber-300/70 bg-amber-50 px-4 py-2 text-xs text-amber-950 dark:border-amber-400/30 dark:bg-amber-400/10 dark:text-amber-100">
      <strong className="font-semibold">Simulation only.</strong> Nothing here drives hardware. Real adapters deliver up to 48 V and 5 A: before you reproduce a scenario on a bench, follow the USB PD
      and Type-C specifications, your certified test lab’s procedures and local electrical codes.
    </aside>
  );
}
