// What the event file tells the signed-in person to do next, and which section is "their card" (shown first, open).
// Pure: the event's status, whether a decisive screening exists and its recommendation, the person's roles.
// The workflow (shared/schemas/enums.ts): logged → testing → screened → held | released; a held unit goes back to
// testing with a new session.
import type { EventStatus, Recommendation, Role } from '../shared/schemas/enums';

/** The sections of the event file a next step can point at (the ids of their cards). */
export type EventCard = 'sessions' | 'decision' | 'findings' | 'fault' | 'follow-ups';

export interface NextStepInput {
  status: EventStatus;
  /** A decisive (non-comparison) screening exists. */
  hasScreening: boolean;
  recommendation: Recommendation | null;
  roles: readonly Role[];
}

export interface NextStep {
  /** The one next step in words. */
  text: string;
  /** The section shown first and open for this person; null: none in particular (the default order). */
  card: EventCard | null;
  /** True when the step is this person's to do; false when it says who is expected to act. */
  yours: boolean;
}

const RECOMMENDATION_WORDS: Record<Recommendation, string> = { go: 'go', conditional: 'conditional', 'no-go': 'no-go' };

/** Who is expected to act at each status, said to someone who is not that person. */
const WAITING: Record<EventStatus, string> = {
  logged: 'A test engineer is expected to open a post-fault session and enter the readings.',
  testing: 'The test engineer is expected to finish the post-fault readings and run the screening.',
  screened: "The operations manager is expected to sign the decision on this screening.",
  held: 'The unit is held: the asset engineer is expected to record the inspection findings; a re-test is a new post-fault session.',
  released: 'Nothing is waiting: the unit was released. Follow-ups are closed as their results come in.',
};

export function nextStep(input: NextStepInput): NextStep {
  const { status, hasScreening, recommendation, roles } = input;
  const has = (...r: Role[]) => r.some((x) => roles.includes(x));
  const mine = (text: string, card: EventCard): NextStep => ({ text, card, yours: true });

  switch (status) {
    case 'logged':
      if (has('tester', 'admin')) return mine('Open a post-fault session, enter the readings and sweeps, then run the screening.', 'sessions');
      if (has('protection')) return mine('Check the fault and attach the relay records; a test engineer then opens a post-fault session.', 'fault');
      break;
    case 'testing':
      if (has('tester', 'admin'))
        return mine(
          hasScreening
            ? 'Enter the new post-fault readings and sweeps, then run the screening again.'
            : 'Enter the post-fault readings and sweeps, then run the screening.',
          'sessions',
        );
      if (has('protection')) return mine('Check the fault and attach any relay records still missing; the test engineer is entering the readings.', 'fault');
      break;
    case 'screened':
      if (has('manager'))
        return mine(
          recommendation
            ? `Sign the decision below: release, release with restrictions, or hold (the screening says ${RECOMMENDATION_WORDS[recommendation]}).`
            : 'Sign the decision below: release, release with restrictions, or hold.',
          'decision',
        );
      if (has('protection')) return { text: WAITING.screened, card: 'fault', yours: false };
      return { text: WAITING.screened, card: 'decision', yours: false };
    case 'held':
      if (has('engineer')) return mine('Record the inspection findings.', 'findings');
      if (has('tester', 'admin')) return mine('After the inspection or repair, open a new post-fault session (re-test) and run a new screening.', 'sessions');
      if (has('protection')) return { text: WAITING.held, card: 'fault', yours: false };
      return { text: WAITING.held, card: 'findings', yours: false };
    case 'released':
      if (has('engineer')) return mine('Record the inspection findings, if any were made.', 'findings');
      if (has('manager', 'admin')) return mine('Record the re-energising and close the follow-ups as their results come in.', 'decision');
      if (has('tester')) return mine('Close the follow-ups as their results come in (gas samples, sweeps).', 'follow-ups');
      if (has('protection')) return { text: WAITING.released, card: 'fault', yours: false };
      return { text: WAITING.released, card: 'decision', yours: false };
  }
  // Logged or testing, for someone who does not test: who is expected to act.
  return { text: WAITING[status], card: has('protection') ? 'fault' : null, yours: false };
}
