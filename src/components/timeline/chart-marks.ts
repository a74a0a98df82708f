/**
 * What the chart marks besides its lines, and how folded marks are named: findings as pins,
 * events (resets, attach/detach, injected faults, notes) as solid lines, contract tolerance bands.
 */
import type { Cluster } from './clusters.ts';
import { placeMarkLabels } from './mark-labels.ts';
import type { PlotArea } from './step-path.ts';

/** A finding on the chart: `label` names it in plain words (drawn where it fits), `rule` is its id. */
export type ChartPin = { tUs: number; tone: 'error' | 'warning' | 'info'; label: string; rule?: string; selected?: boolean };
export type ChartBand = { startUs: number; endUs: number; minMv: number; maxMv: number };
/** Something that happened on the bus (Hard Reset, attach, an injected fault): a solid line with a label. */
export type ChartEvent = { tUs: number; label: string; tone: 'reset' | 'attach' | 'fault' | 'note' };

export const EVENT_COLOURS: Record<ChartEvent['tone'], string> = { reset: '#be123c', attach: '#15803d', fault: '#a21caf', note: '#64748b' };
export const PIN_COLOURS: Record<ChartPin['tone'], string> = { error: '#dc2626', warning: '#ea580c', info: '#0284c7' };

/** Rows of mark names in the plot: two along the top for events, two along the bottom for findings. */
const NAME_ROWS = 2;
const NAME_ROW_PX = 12;

/** Which mark of a folded group names it: a reset before a fault, an attach or a note; an error before a warning. */
const EVENT_RANK: Record<ChartEvent['tone'], number> = { reset: 0, fault: 1, attach: 2, note: 3 };
const PIN_RANK: Record<ChartPin['tone'], number> = { error: 0, warning: 1, info: 2 };
// The two tone sets do not overlap, so the tone alone says which table ranks it.
const rankOf = (item: ChartEvent | ChartPin) => (item.tone in EVENT_RANK ? EVENT_RANK[item.tone as ChartEvent['tone']] : PIN_RANK[item.tone as ChartPin['tone']]);

/** A folded group's name: its most telling member's label and how many more it holds ("Hard Reset +2"). */
export function clusterName<T extends ChartEvent | ChartPin>(cluster: Cluster, items: readonly T[]): { item: T; text: string } {
  let item = items[cluster.first]!;
  for (let index = cluster.first + 1; index < cluster.first + cluster.count; index++) if (rankOf(items[index]!) < rankOf(item)) item = items[index]!;
  return { item, text: cluster.count > 1 ? `${item.label} +${cluster.count - 1}` : item.label };
}

/** The names of folded marks ("Hard Reset +2", after the group's most telling member) placed so none overlap; those without room are left out. */
export function markNames<T extends ChartEvent | ChartPin>(clusters: readonly Cluster[], items: readonly T[], xOf: (tUs: number) => number, plot: PlotArea, edge: 'top' | 'bottom') {
  const names = clusters.map((cluster) => ({ xPx: xOf(cluster.startUs), ...clusterName(cluster, items), key: cluster.first }));
  const placed = placeMarkLabels(names, plot.x, plot.x + plot.width, NAME_ROWS);
  return names.flatMap((name, index) => {
    const at = placed[index];
    if (!at) return [];
    const y = edge === 'top' ? plot.y + 10 + at.row * NAME_ROW_PX : plot.y + plot.height - 4 - at.row * NAME_ROW_PX;
    return [{ key: name.key, text: name.text, item: name.item, x: at.xPx, y, anchor: at.anchor }];
  });
}
