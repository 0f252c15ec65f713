import type { ActionItemView, CycleView, ReviewNoteView } from '@tidemark/shared';
import type { ActionItem } from '../entities/action-item.entity';
import type { AuditCycle } from '../entities/audit-cycle.entity';
import type { ReviewNote } from '../entities/review-note.entity';
import type { OperatorLookup } from './clinical-mappers';

export function mapAction(action: ActionItem, people: OperatorLookup): ActionItemView {
  return { id: action.id, cycleId: action.cycleId, action: action.action, owner: people(action.ownerId), dueDate: action.dueDate, state: action.state, version: action.version };
}

export function mapCycle(cycle: AuditCycle, actions: ActionItem[], people: OperatorLookup): CycleView {
  return {
    id: cycle.id,
    auditId: cycle.auditId,
    number: cycle.number,
    periodStart: cycle.periodStart,
    periodEnd: cycle.periodEnd,
    state: cycle.state,
    frozenAt: cycle.frozenAt ? new Date(cycle.frozenAt).toISOString() : null,
    presentedDate: cycle.presentedDate,
    notes: cycle.notes,
    version: cycle.version,
    actions: actions.map((action) => mapAction(action, people)),
  };
}

export function mapNote(note: ReviewNote, people: OperatorLookup): ReviewNoteView {
  return { id: note.id, auditId: note.auditId, cycleId: note.cycleId, topic: note.topic, text: note.text, author: people(note.authorId), createdAt: new Date(note.createdAt).toISOString() };
}
