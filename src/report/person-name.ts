/** A DICOM person name (family^given^middle^prefix^suffix) as people write it: "Family, Given Middle". */
export function personName(pn: string): string {
  const [family = '', given = '', middle = '', prefix = '', suffix = ''] = pn
    .split('=')[0]!
    .split('^')
    .map((p) => p.trim());
  const first = [prefix, given, middle].filter(Boolean).join(' ');
  return [family, first].filter(Boolean).join(', ') + (suffix ? ` ${suffix}` : '');
}
