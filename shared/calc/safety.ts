/**
 * The caution shown wherever a figure leads to work on or near energised equipment.
 * Wording is ours; it points at NFPA 70E and the authority having jurisdiction [CP].
 */
export const SAFETY_CAUTION =
  'Work on de-energised equipment wherever you can. Energised work, infrared scans with covers ' +
  'open and breaker trip testing follow NFPA 70E (risk assessment, PPE, qualified persons) and ' +
  'the local authority having jurisdiction. The manufacturer\u2019s instructions and a licensed ' +
  'professional\u2019s judgement override any figure shown here: the figures are aids, not a ' +
  'substitute for them.';
