/** Printed with every human-facing output. */
export const CAUTION =
  'Caution: plumbline is an aid to, never a replacement for, the review of a qualified medical physicist. ' +
  "Beam data must be the clinic's own, commissioned and validated. Local regulations and licensed practice prevail.";
