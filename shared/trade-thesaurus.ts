/**
 * The words people use on panel directories for the same load. Each group is one meaning: its
 * terms are written as typed on a directory (any case, with or without the slash or dash), and
 * `narrower` names the groups that are kinds of it — "A/C" finds a rooftop unit, but "RTU" does
 * not find every air conditioner. Words that also mean something else on a directory are left
 * out ("HP" is horsepower, "Cu" copper, "off" a state). The abbreviations are the usual ones on
 * hand-written and typed directories [CP]; the list is ours and deliberately small.
 */

export interface ThesaurusGroup {
  /** a name for tests and debugging; never shown */
  key: string;
  terms: readonly string[];
  narrower?: readonly string[];
}

export const TRADE_THESAURUS: readonly ThesaurusGroup[] = [
  { key: 'refrigerator', terms: ['refrigerator', 'fridge', 'refrig', 'frig', 'reefer'], narrower: ['cooler', 'freezer'] },
  { key: 'cooler', terms: ['cooler', 'clr'] },
  { key: 'freezer', terms: ['freezer', 'frzr'] },
  {
    key: 'hvac',
    terms: ['hvac', 'ac', 'a/c', 'air conditioner', 'air conditioning', 'air cond', 'cooling'],
    narrower: ['rtu', 'condenser', 'ahu', 'heat-pump', 'mini-split'],
  },
  { key: 'rtu', terms: ['rtu', 'rooftop unit', 'roof top unit'] },
  { key: 'condenser', terms: ['condenser', 'condensing unit', 'cond unit'] },
  { key: 'ahu', terms: ['ahu', 'air handler', 'air handling unit', 'air handler unit'] },
  { key: 'heat-pump', terms: ['heat pump', 'heatpump'] },
  { key: 'mini-split', terms: ['mini split', 'minisplit', 'ductless'] },
  { key: 'receptacle', terms: ['receptacle', 'outlet', 'plug', 'recept', 'recep', 'rec', 'recs', 'rcpt', 'convenience outlet'] },
  { key: 'gfci', terms: ['gfci', 'gfi'] },
  { key: 'lighting', terms: ['lighting', 'light', 'lights', 'ltg', 'lts', 'lt', 'lite', 'lites', 'ltng'] },
  { key: 'water-heater', terms: ['water heater', 'wh', 'ewh', 'hot water heater', 'hwh', 'hw heater'] },
  { key: 'kitchen', terms: ['kitchen', 'kit', 'kitch', 'ktch', 'ktchn'] },
  { key: 'bathroom', terms: ['bathroom', 'bath', 'bathrm', 'bth', 'bthrm'] },
  { key: 'bedroom', terms: ['bedroom', 'br', 'bdrm', 'bed rm', 'bedrm', 'bed room'] },
  { key: 'dishwasher', terms: ['dishwasher', 'dw', 'dish washer'] },
  { key: 'disposal', terms: ['disposal', 'disp', 'garbage disposal'] },
  { key: 'microwave', terms: ['microwave', 'micro'] },
  { key: 'exhaust-fan', terms: ['exhaust fan', 'exh fan', 'ef', 'exhaust'] },
  { key: 'washer', terms: ['washer', 'washing machine', 'clothes washer'] },
  { key: 'dryer', terms: ['dryer', 'clothes dryer', 'dryr'] },
  { key: 'emergency', terms: ['emergency', 'emerg', 'em'] },
  { key: 'garage', terms: ['garage', 'gar', 'grg'] },
  { key: 'office', terms: ['office', 'ofc'] },
  { key: 'corridor', terms: ['corridor', 'corr', 'hall', 'hallway'] },
  { key: 'mechanical', terms: ['mechanical', 'mech'] },
  { key: 'elevator', terms: ['elevator', 'elev'] },
];
