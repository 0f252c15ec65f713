/**
 * Context-specific words (OWASP ASVS 5.0 §6.1.2, §6.2.11): the product's name, the roles, and
 * the trade's words that anyone guessing a Tidemark password at a periodontal practice would try
 * first. Lower-case letters only. The list is documented in docs/asvs-5.0-l2.md (D2).
 */
export const CONTEXT_WORDS: readonly string[] = [
  // The product and where it is used
  'tidemark', 'practice', 'clinic', 'surgery', 'dental', 'dentist', 'dentistry', 'periodontal', 'periodontics', 'periodontist', 'perio',
  // The roles and the work
  'admin', 'administrator', 'audit', 'auditlead', 'lead', 'clinician', 'partner', 'governance', 'committee',
  // The trade's words
  'gingiva', 'gingival', 'gingivectomy', 'gum', 'gums', 'crown', 'crowns', 'lengthening', 'tooth', 'teeth', 'papilla', 'rebound',
  'recall', 'implant', 'margin', 'probe', 'probing', 'flap', 'suture', 'sutures', 'scalpel', 'laser',
  // The usual companions of such words
  'password', 'welcome', 'demo', 'login', 'signin',
];

/** Shortest extra word (from the member's name or e-mail) that counts; shorter ones are too common to refuse on. */
const MIN_PERSONAL_WORD = 3;

/**
 * Whether the password is made of nothing but context words: once digits, spaces and symbols
 * are dropped and letters lower-cased, what is left splits entirely into words of
 * {@link CONTEXT_WORDS} and `personalWords` (the member's name and the parts of their e-mail
 * address), in any order and repeated — "Tidemark2026!", "gingiva-crown-rebound",
 * "PatPartner1990". A password with any other word in it passes ("harbour-tidemark-lantern").
 * A password with no letters at all is left to the length and common-password checks.
 */
export function isMadeOfContextWords(password: string, personalWords: readonly string[] = []): boolean {
  const letters = password.toLowerCase().replace(/[^a-z]/g, '');
  if (letters === '') return false;
  const personal = personalWords.flatMap((text) => text.toLowerCase().split(/[^a-z]+/)).filter((word) => word.length >= MIN_PERSONAL_WORD);
  const words = new Set([...CONTEXT_WORDS, ...personal]);
  // Word break by dynamic programming: splits[i] is true when letters[0, i) splits into words.
  const splits = [true, ...Array<boolean>(letters.length).fill(false)];
  for (let end = 1; end <= letters.length; end++) {
    for (let start = 0; start < end && !splits[end]; start++) {
      if (splits[start] && words.has(letters.slice(start, end))) splits[end] = true;
    }
  }
  return splits[letters.length];
}
