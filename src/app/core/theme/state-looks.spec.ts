import { CASE_STATUSES, CASE_STATUS_LABELS } from '@tidemark/shared';
import { ACTION_STATE_LOOK } from '../../features/audits/badges/action-state-badge';
import { CYCLE_STAGE_LOOK } from '../../features/audits/badges/cycle-stage-badge';
import { VERDICT_LOOK } from '../../features/audits/badges/verdict-badge';
import { RECALL_STATE_LOOK } from '../../features/today/recall-card/recall-card';
import { TIMELINE_LOOK } from '../../features/cases/visit-timeline/visit-timeline';
import { outboxStatusLook } from '../../features/outbox/outbox-status-badge/outbox-status-badge';
import { CASE_STATUS_ICONS } from '../../shared/case-status-badge/case-status-badge';
import { STABILITY_LOOK } from '../../shared/stability-badge/stability-badge';

/** A set of states and how each is shown. */
type Looks = Readonly<Record<string, { readonly icon: string; readonly word: string }>>;

/**
 * DESIGN.md §8: "States are never carried by colour alone (an icon and a word go with every
 * colour)". Within each set every state needs a word of its own and an icon of its own, or two
 * states would differ by tint only.
 */
function expectToldApartWithoutColour(looks: Looks): void {
  const entries = Object.values(looks);
  for (const look of entries) {
    expect(look.word.trim()).not.toBe('');
    expect(look.icon.trim()).not.toBe('');
  }
  expect(new Set(entries.map((look) => look.word.toLowerCase())).size).toBe(entries.length);
  expect(new Set(entries.map((look) => look.icon)).size).toBe(entries.length);
}

describe('state badges never rest on colour alone', () => {
  it.each([
    ['audit cycle stages', CYCLE_STAGE_LOOK],
    ['standard verdicts', VERDICT_LOOK],
    ['action states', ACTION_STATE_LOOK],
    ['recall states on Today', RECALL_STATE_LOOK],
    ['recall timeline states', TIMELINE_LOOK],
    ['site stability classes', STABILITY_LOOK],
  ] as const)('%s each have their own word and icon', (_name, looks) => {
    expectToldApartWithoutColour(looks);
  });

  it('case states each have their own word and icon', () => {
    expectToldApartWithoutColour(Object.fromEntries(CASE_STATUSES.map((status) => [status, { icon: CASE_STATUS_ICONS[status], word: CASE_STATUS_LABELS[status] }])));
  });

  it('outbox messages each have their own word and icon, a retry apart from a first send', () => {
    expectToldApartWithoutColour({
      sent: outboxStatusLook({ status: 'sent', attempts: 1 }),
      failed: outboxStatusLook({ status: 'failed', attempts: 5 }),
      waiting: outboxStatusLook({ status: 'queued', attempts: 0 }),
      retrying: outboxStatusLook({ status: 'queued', attempts: 2 }),
    });
  });
});
