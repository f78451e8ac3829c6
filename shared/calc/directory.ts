/**
 * Circuit directory checks, NFPA 70 (NEC) 408.4(A) (2020/2023): every circuit legibly identified as
 * to its clear, evident and specific purpose, in enough detail to tell it from all others; spare
 * positions described as spare; no description that depends on transient conditions of occupancy
 * (such as a person's name for a room).
 */
import type { CircuitStatus } from '../domain';

export type DirectoryWarningCode =
  | 'directory-blank'
  | 'directory-vague'
  | 'directory-person-name'
  | 'directory-spare-unlabelled'
  | 'directory-says-spare';

export interface DirectoryWarning {
  code: DirectoryWarningCode;
  message: string;
}

/** Words that say nothing about what a circuit feeds. */
const VAGUE_WORDS = new Set([
  'misc', 'miscellaneous', 'tbd', 'tba', 'stuff', 'various', 'unknown', 'unk', 'n/a', 'na', 'none',
]);

/**
 * Words that take a possessive without being a person ("men's room", "janitor's closet"):
 * roles and groups describe a use, not an occupant.
 */
const NOT_A_PERSON = new Set([
  'men', 'women', 'mens', 'womens', 'children', 'childrens', 'boys', 'girls', 'ladies', 'gentlemen',
  'employee', 'employees', 'staff', 'visitor', 'visitors', 'guest', 'guests', 'owner', 'owners',
  'tenant', 'tenants', 'manager', 'managers', 'director', 'president', 'nurse', 'nurses', 'doctor',
  'doctors', 'janitor', 'janitors', 'custodian', 'custodians', 'teacher', 'teachers', 'principal',
  'student', 'students', 'customer', 'customers', 'patient', 'patients', 'superintendent', 'chef',
  'cook', 'driver', 'drivers', 'officer', 'officers', 'engineer', 'engineers', 'operator',
  'operators', 'resident', 'residents', 'family', 'kid', 'kids', 'child', 'baby', 'master',
  'building', 'today', 'tenant', 'landlord', 'clerk', 'secretary', 'receptionist', 'pastor',
]);

/**
 * Common given names. A heuristic only: names that are also ordinary words in a panel directory
 * (Ray as in X-ray, Jack, Bill, Mark, Will, Al, Amber …) are left out on purpose.
 */
const GIVEN_NAMES = new Set([
  'john', 'mary', 'james', 'robert', 'michael', 'david', 'richard', 'joseph', 'thomas', 'charles',
  'christopher', 'daniel', 'matthew', 'anthony', 'steven', 'paul', 'andrew', 'joshua', 'kenneth',
  'kevin', 'brian', 'george', 'timothy', 'ronald', 'jason', 'edward', 'jeffrey', 'jacob', 'gary',
  'nicholas', 'eric', 'jonathan', 'stephen', 'larry', 'justin', 'scott', 'brandon', 'benjamin',
  'samuel', 'gregory', 'alexander', 'patrick', 'dennis', 'jerry', 'tyler', 'aaron', 'jose', 'adam',
  'nathan', 'henry', 'douglas', 'zachary', 'peter', 'kyle', 'noah', 'ethan', 'jeremy', 'walter',
  'keith', 'roger', 'terry', 'sean', 'gerald', 'carl', 'harold', 'dylan', 'arthur', 'lawrence',
  'jesse', 'bryan', 'billy', 'bruce', 'gabriel', 'joe', 'albert', 'willie', 'alan', 'eugene',
  'russell', 'vincent', 'philip', 'bobby', 'johnny', 'bradley', 'bob', 'jim', 'tom', 'mike',
  'dave', 'steve', 'dan', 'tony', 'chris', 'matt', 'nick', 'sam', 'ben', 'greg', 'jeff', 'tim',
  'ken', 'ron', 'fred', 'ted', 'patricia', 'jennifer', 'linda', 'elizabeth', 'barbara', 'susan',
  'jessica', 'sarah', 'karen', 'lisa', 'nancy', 'betty', 'sandra', 'margaret', 'ashley',
  'kimberly', 'emily', 'donna', 'michelle', 'amanda', 'melissa', 'deborah', 'stephanie',
  'rebecca', 'sharon', 'laura', 'cynthia', 'amy', 'kathleen', 'angela', 'shirley', 'brenda',
  'pamela', 'nicole', 'anna', 'samantha', 'katherine', 'christine', 'debra', 'rachel', 'carolyn',
  'janet', 'maria', 'catherine', 'heather', 'diane', 'olivia', 'julie', 'joyce', 'ruth', 'lauren',
  'kelly', 'christina', 'joan', 'evelyn', 'judith', 'andrea', 'hannah', 'megan', 'cheryl',
  'jacqueline', 'martha', 'teresa', 'gloria', 'sara', 'janice', 'ann', 'kathryn', 'abigail',
  'sophia', 'frances', 'alice', 'judy', 'isabella', 'julia', 'denise', 'danielle', 'marilyn',
  'beverly', 'charlotte', 'natalie', 'theresa', 'diana', 'brittany', 'doris', 'kayla', 'lori',
  'marie', 'jen', 'liz', 'kate',
]);

const HONORIFIC = /\b(mr|mrs|ms|miss|dr)\.?\s+[a-z]/i;
const POSSESSIVE = /\b([a-z]+)['\u2019]s\b/gi;

/**
 * The text that looks like a person's name (NEC 408.4(A), 2020/2023: no descriptions that depend on
 * transient conditions of occupancy), or null. Heuristic: honorifics, possessives that are not a
 * role or group, and common given names.
 */
export function personNameIn(description: string): string | null {
  const honorific = HONORIFIC.exec(description);
  if (honorific !== null) return honorific[0];
  for (const match of description.matchAll(POSSESSIVE)) {
    if (!NOT_A_PERSON.has(match[1].toLowerCase())) return match[0];
  }
  for (const word of description.split(/[^A-Za-z]+/)) {
    if (GIVEN_NAMES.has(word.toLowerCase())) return word;
  }
  return null;
}

const SAYS_SPARE = /\bspare\b/i;

/**
 * Directory description warnings for NEC 408.4(A) (2020/2023).
 * - in use with a blank description → 'directory-blank';
 * - vague words (misc, ?, TBD, stuff, various, unknown …) → 'directory-vague';
 * - a person's name — a possessive ("Bob's office"), a title ("Mr. Lee") or a common given name —
 *   → 'directory-person-name' (heuristic: occupants change, the directory must not depend on them);
 * - status spare but the description does not say spare → 'directory-spare-unlabelled';
 * - in use but the description is just "spare" → 'directory-says-spare'.
 * A space (no breaker) draws none.
 */
export function directoryWarnings(description: string | null, status: CircuitStatus): DirectoryWarning[] {
  if (status === 'space') return [];
  const text = (description ?? '').trim();
  const warnings: DirectoryWarning[] = [];
  if (status === 'spare' && !SAYS_SPARE.test(text)) {
    warnings.push({
      code: 'directory-spare-unlabelled',
      message: 'This breaker is a spare: NEC 408.4(A) wants the directory to say "spare".',
    });
  }
  if (text === '') {
    if (status === 'in-use') {
      warnings.push({
        code: 'directory-blank',
        message: 'No description: say what this circuit feeds and where (NEC 408.4(A)).',
      });
    }
    return warnings;
  }
  if (status === 'in-use' && /^spare\W*$/i.test(text)) {
    warnings.push({
      code: 'directory-says-spare',
      message: 'Marked in use but described as spare: correct the status or the description.',
    });
  }
  const words = text.toLowerCase().split(/[^a-z/]+/).filter((w) => w !== '');
  const vague = words.find((w) => VAGUE_WORDS.has(w)) ?? (text.includes('?') ? '?' : undefined);
  if (vague !== undefined) {
    warnings.push({
      code: 'directory-vague',
      message: `"${vague}" does not say what the circuit feeds: name the load and its location (NEC 408.4(A)).`,
    });
  }
  const name = personNameIn(text);
  if (name !== null) {
    warnings.push({
      code: 'directory-person-name',
      message:
        `"${name}" looks like a person's name. People move; describe the room by its number or use ` +
        '(NEC 408.4(A)).',
    });
  }
  return warnings;
}
