// What goes wrong on a strip mid-bout, in the words a technician would say at the strip (common
// practice on competition floors); anything else is typed.
export const COMMON_SYMPTOMS = [
  'Touches not showing',
  'Lights without a touch',
  'Reel does not wind back',
  'Floor cable damaged',
  'Apparatus has no power',
  'Piste earth fault',
] as const;
