// Safety and scope cautions shown beside the figures. Plain wording of our own; each one defers
// to local codes and licensed practice. (REFERENCE-VALUES.md, "Safety".)

export const CAUTION_CALL_811 =
  'Call 811 and wait for the utilities to be marked before driving rods, piers or piles or digging (811 is the ' +
  "national call-before-you-dig number, FCC 05-59). Follow your state's one-call law.";

export const CAUTION_ISOCYANATES =
  'Two-part polyurethane contains isocyanates: crews wear the protective equipment that the safety data sheet of ' +
  'the material requires, and follow its handling and ventilation instructions.';

export const CAUTION_LIFTING =
  'Lifting or stabilising a structure can crack finishes and break plumbing or other buried lines. Monitor for ' +
  'movement throughout the work and stop when the structure starts to move unexpectedly.';

export const CAUTION_ENGINEER =
  'These figures are estimates for planning and pricing. Structural decisions belong to a licensed engineer; ' +
  'the engineer of record and the local building department decide, and local codes prevail.';
