import { CYCLE_STATE_NEXT, type CycleState } from '@tidemark/shared';

/** A stage move a cycle can make, as its button says it. */
export interface StageMove {
  readonly to: CycleState;
  readonly label: string;
  readonly icon: string;
}

const FORWARD: Readonly<Record<CycleState, Omit<StageMove, 'to'>>> = {
  scoping: { label: 'Back to scoping', icon: 'edit_note' },
  gathering: { label: 'Start gathering data', icon: 'playlist_add' },
  weighing: { label: 'Start weighing results', icon: 'balance' },
  reported: { label: 'Report and freeze results', icon: 'lock' },
  closed: { label: 'Close the cycle', icon: 'task_alt' },
};

/** The moves open to a cycle in `from`, in the order CYCLE_STATE_NEXT lists them. */
export function stageMovesFrom(from: CycleState): StageMove[] {
  return CYCLE_STATE_NEXT[from].map((to) => ({
    to,
    ...FORWARD[to],
    // Weighing can go back to gathering when more data are needed before reporting.
    ...(from === 'weighing' && to === 'gathering' ? { label: 'Back to gathering data', icon: 'undo' } : {}),
  }));
}
