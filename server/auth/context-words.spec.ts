import { CONTEXT_WORDS, isMadeOfContextWords } from './context-words';

// The rule is ours (ASVS 5.0 §6.2.11 asks that documented context words refuse guessable passwords, not how):
// letters only, lower-cased, split wholly into context or personal words.
describe('isMadeOfContextWords', () => {
  it('refuses passwords made only of context words or the member’s own name and e-mail', () => {
    const refused: Array<[string, string[]]> = [
      ['Tidemark2026!', []],
      ['tidemark tidemark tidemark', []],
      ['Gingiva-Crown-Rebound-99', []],
      ['periodontal.practice.password', []],
      ['PatPartner1990!!', ['Dr Pat Partner (demo)', 'partner@example.org']],
      ['quayle-noor-2026', ['Dr Noor Quayle', 'noor.quayle@example.org']],
    ];
    for (const [password, personal] of refused) expect(isMadeOfContextWords(password, personal), password).toBe(true);
  });

  it.each([
    ['harbour-tidemark-lantern'],
    ['correct horse battery staple'],
    ['crown-of-thorns-2026'],
    ['1234567890123'],
  ])('lets %s through (another word, or no letters at all)', (password) => {
    expect(isMadeOfContextWords(password, ['Dr Pat Partner (demo)', 'partner@example.org'])).toBe(false);
  });

  it('ignores personal words shorter than three letters, and keeps its list lower-case letters only', () => {
    expect(isMadeOfContextWords('dr-tidemark-dr', ['Dr'])).toBe(false);
    for (const word of CONTEXT_WORDS) expect(word).toMatch(/^[a-z]+$/);
  });
});
