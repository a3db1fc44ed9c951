import type { SignerDeed } from '../types/certificates.js';

/** Excluded readings named one by one per run; beyond this many, "and N more". */
const LISTED_SEQS = 5;

function joinWords(parts: readonly string[]): string {
  if (parts.length <= 1) return parts[0] ?? '';
  return `${parts.slice(0, -1).join(', ')} and ${parts[parts.length - 1]}`;
}

const runs = (ids: readonly number[]) => (ids.length === 1 ? `run ${ids[0]}` : `runs ${joinWords(ids.map(String))}`);
const readingsWord = (n: number) => (n === 1 ? '1 reading' : `${n} readings`);

/**
 * The no-self-sign rule's words: what the would-be signatory did to the job's data, in one sentence
 * that starts "you …" ("you entered 10 readings of run 12, excluded reading #4 of run 12 and edited
 * the budget of run 13"), or null when they did nothing that bars them. Deeds of one kind are merged
 * per run (readings summed, excluded readings listed), runs in ascending order.
 */
export function describeSignerDeeds(deeds: readonly SignerDeed[]): string | null {
  const opened = new Set<number>();
  const entered = new Map<number, number>();
  const imported = new Map<number, number>();
  const excluded = new Map<number, Set<number>>();
  const budgets = new Set<number>();
  for (const deed of deeds) {
    switch (deed.kind) {
      case 'opened_run':
        opened.add(deed.runId);
        break;
      case 'entered':
        entered.set(deed.runId, (entered.get(deed.runId) ?? 0) + deed.readings);
        break;
      case 'imported':
        imported.set(deed.runId, (imported.get(deed.runId) ?? 0) + deed.readings);
        break;
      case 'excluded':
        if (!excluded.has(deed.runId)) excluded.set(deed.runId, new Set());
        excluded.get(deed.runId)!.add(deed.seq);
        break;
      case 'edited_budget':
        budgets.add(deed.runId);
        break;
    }
  }
  const ascending = (ids: Iterable<number>) => [...ids].sort((a, b) => a - b);
  const parts: string[] = [];
  if (opened.size > 0) parts.push(`opened ${runs(ascending(opened))}`);
  for (const runId of ascending(entered.keys())) if (entered.get(runId)! > 0) parts.push(`entered ${readingsWord(entered.get(runId)!)} of run ${runId}`);
  for (const runId of ascending(imported.keys())) if (imported.get(runId)! > 0) parts.push(`imported ${readingsWord(imported.get(runId)!)} into run ${runId}`);
  for (const runId of ascending(excluded.keys())) {
    const seqs = ascending(excluded.get(runId)!);
    const named = seqs.slice(0, LISTED_SEQS).map((s) => `#${s}`);
    if (seqs.length > LISTED_SEQS) named.push(`${seqs.length - LISTED_SEQS} more`);
    parts.push(`excluded ${seqs.length === 1 ? 'reading' : 'readings'} ${joinWords(named)} of run ${runId}`);
  }
  if (budgets.size > 0) parts.push(`edited the budget of ${runs(ascending(budgets))}`);
  return parts.length === 0 ? null : `you ${joinWords(parts)}`;
}

/** The refusal and the review page's blocker: the deeds, then who must sign. */
export function selfSignRefusal(deeds: readonly SignerDeed[]): string | null {
  const said = describeSignerDeeds(deeds);
  return said === null ? null : `${said}: another lead must sign`;
}
