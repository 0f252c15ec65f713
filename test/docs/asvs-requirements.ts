/** Level of an ASVS requirement that the Level 2 checklist must cover. */
export type AsvsLevel = 1 | 2;

/** One chapter of the checklist: its heading and the Level 1 and 2 requirement ids it must list. */
export interface AsvsChapter {
  /** Chapter number, e.g. 6 for "V6 Authentication". */
  number: number;
  name: string;
  /** Requirement id (without the `v5.0.0-` prefix) → level. Level 3 requirements are out of scope. */
  requirements: Readonly<Record<string, AsvsLevel>>;
}

/** Expands `{ '6.2': [1, 1, 2] }` (levels of 6.2.1, 6.2.2, 6.2.3) into `{ '6.2.1': 1, ... }`, leaving out `3`s. */
function sections(levels: Readonly<Record<string, readonly (AsvsLevel | 3)[]>>): Record<string, AsvsLevel> {
  const requirements: Record<string, AsvsLevel> = {};
  for (const [section, list] of Object.entries(levels)) {
    list.forEach((level, index) => {
      if (level !== 3) requirements[`${section}.${index + 1}`] = level;
    });
  }
  return requirements;
}

/**
 * The chapters of OWASP ASVS 5.0.0 that docs/asvs-5.0-l2.md maps, in the checklist's order, with
 * the level of every requirement (Level 3 listed as 3 so the numbering stays visible, then dropped).
 * Source: OWASP/ASVS, 5.0/docs_en/OWASP_Application_Security_Verification_Standard_5.0.0_en.csv
 * (the 5.0.0 release export, commit 5cf9b032440be53ce345ab3c130fda46ba1ce7a2), cross-checked with
 * 5.0/en/0x15-V6-Authentication.md at commit 113cb33713590632af97c6106514548238fcd901
 * (6.3.3, multi-factor authentication, is Level 2).
 */
export const ASVS_CHAPTERS: readonly AsvsChapter[] = [
  {
    number: 6,
    name: 'Authentication',
    requirements: sections({
      '6.1': [1, 2, 2],
      '6.2': [1, 1, 1, 1, 1, 1, 1, 1, 2, 2, 2, 2],
      '6.3': [1, 1, 2, 2, 3, 3, 3, 3],
      '6.4': [1, 1, 2, 2, 3, 3],
      '6.5': [2, 2, 2, 2, 2, 3, 3, 3],
      '6.6': [2, 2, 2, 3],
      '6.7': [3, 3],
      '6.8': [2, 2, 2, 2],
    }),
  },
  {
    number: 7,
    name: 'Session Management',
    requirements: sections({ '7.1': [2, 2, 2], '7.2': [1, 1, 1, 1], '7.3': [2, 2], '7.4': [1, 1, 2, 2, 2], '7.5': [2, 2, 3], '7.6': [2, 2] }),
  },
  {
    number: 8,
    name: 'Authorization',
    requirements: sections({ '8.1': [1, 2, 3, 3], '8.2': [1, 1, 2, 3], '8.3': [1, 3, 3], '8.4': [2, 3] }),
  },
  {
    number: 2,
    name: 'Validation and Business Logic',
    requirements: sections({ '2.1': [1, 2, 2], '2.2': [1, 1, 2], '2.3': [1, 2, 2, 2, 3], '2.4': [2, 3] }),
  },
  {
    number: 1,
    name: 'Encoding and Sanitization',
    requirements: sections({
      '1.1': [2, 2],
      '1.2': [1, 1, 1, 1, 1, 2, 2, 2, 2, 3],
      '1.3': [1, 1, 2, 2, 2, 2, 2, 2, 2, 2, 2, 3],
      '1.4': [2, 2, 2],
      '1.5': [1, 2, 3],
    }),
  },
  {
    number: 5,
    name: 'File Handling',
    requirements: sections({ '5.1': [2], '5.2': [1, 1, 2, 3, 3, 3], '5.3': [1, 1, 3], '5.4': [2, 2, 2] }),
  },
  {
    number: 16,
    name: 'Security Logging and Error Handling',
    requirements: sections({ '16.1': [2], '16.2': [2, 2, 2, 2, 2], '16.3': [2, 2, 2, 2], '16.4': [2, 2, 2], '16.5': [2, 2, 2, 3] }),
  },
  {
    number: 3,
    name: 'Web Frontend Security',
    requirements: sections({
      '3.1': [3],
      '3.2': [1, 1, 3],
      '3.3': [1, 2, 2, 2, 3],
      '3.4': [1, 1, 2, 2, 2, 2, 3, 3],
      '3.5': [1, 1, 1, 2, 2, 3, 3, 3],
      '3.6': [3],
      '3.7': [2, 2, 3, 3, 3],
    }),
  },
  {
    number: 4,
    name: 'API and Web Service',
    requirements: sections({ '4.1': [1, 2, 2, 3, 3], '4.2': [2, 3, 3, 3, 3], '4.3': [2, 2], '4.4': [1, 2, 2, 2] }),
  },
  {
    number: 11,
    name: 'Cryptography',
    requirements: sections({
      '11.1': [2, 2, 3, 3],
      '11.2': [2, 2, 2, 3, 3],
      '11.3': [1, 1, 2, 3, 3],
      '11.4': [1, 2, 2, 2],
      '11.5': [2, 3],
      '11.6': [2, 3],
      '11.7': [3, 3],
    }),
  },
  {
    number: 13,
    name: 'Configuration',
    requirements: sections({ '13.1': [2, 3, 3, 3], '13.2': [2, 2, 2, 2, 2, 3], '13.3': [2, 2, 3, 3], '13.4': [1, 2, 2, 2, 2, 3, 3] }),
  },
  {
    number: 14,
    name: 'Data Protection',
    requirements: sections({ '14.1': [2, 2], '14.2': [1, 2, 2, 2, 3, 3, 3, 3], '14.3': [1, 2, 2] }),
  },
];
