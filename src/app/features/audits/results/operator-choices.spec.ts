import type { Role, SessionUser } from '@tidemark/shared';
import { operatorChoices } from './operator-choices';

const OPERATORS = [
  { id: 4, displayName: 'Dr Nia Strand' },
  { id: 2, displayName: 'Dr Ada Lead' },
  { id: 7, displayName: 'Dr Mo Quill' },
];

function viewer(role: Role, id = 2): SessionUser {
  return { id, role, email: `${role}@example.org`, displayName: role };
}

describe('operatorChoices', () => {
  it('offers the audit lead and partners every operator by name, themselves marked', () => {
    expect(operatorChoices(viewer('audit_lead'), OPERATORS).map((choice) => choice.label)).toEqual(['Dr Ada Lead (you)', 'Dr Mo Quill', 'Dr Nia Strand']);
    expect(operatorChoices(viewer('partner', 9), OPERATORS).map((choice) => choice.id)).toEqual([2, 7, 4]);
  });

  it('offers a clinician their own cases only, and governance nothing', () => {
    expect(operatorChoices(viewer('clinician', 7), OPERATORS)).toEqual([{ id: 7, label: 'My cases only' }]);
    expect(operatorChoices(viewer('governance'), OPERATORS)).toEqual([]);
    expect(operatorChoices(null, OPERATORS)).toEqual([]);
  });
});
