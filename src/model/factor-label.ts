import type { Factor } from './point-dose.js';

const cm = (v: number) => `${Number(v.toFixed(2))} cm`;

/** Where a photon PDD came from, said beside it (its table value may read differently). */
const PDD_SOURCE: Readonly<Record<string, string>> = {
  'table-at-d0': ' (the table renormalised to 100 % at d0)',
  'from-tpr': ' (from the TPR table at this SSD, normalised at d0)',
};

/** A factor as a physicist writes it by hand, with its arguments and unit. */
export function factorLabel(f: Factor): string {
  const a = f.args;
  switch (f.key) {
    case 'D0':
      return "D'0 (cGy/MU)";
    case 'Sc':
      return `Sc(${cm(a[0]!)})`;
    case 'Sp':
      return `Sp(${cm(a[0]!)})`;
    case 'PDD':
      return f.name === 'square-root'
        ? `√(PDD(${cm(a[0]!)}, ${cm(a[1]!)})·PDD(${cm(a[0]!)}, ${cm(a[2]!)}))/100 at SSD ${cm(a[3]!)}`
        : `PDD(${cm(a[0]!)}, ${cm(a[1]!)}, SSD ${cm(a[2]!)})/100${PDD_SOURCE[f.name ?? ''] ?? ''}`;
    case 'Se':
      return a.length === 2 ? `Se ${f.name}(√(${cm(a[0]!)} × ${cm(a[1]!)}) by the square-root rule)` : `Se ${f.name}(${cm(a[0]!)})`;
    case 'TPR':
      return `${f.name ?? 'TPR'}(${cm(a[0]!)}, ${cm(a[1]!)})`;
    case 'SpTPR':
      return `Sp·${f.name ?? 'TPR'} by Clarkson (${cm(a[0]!)}, ${a[1]} sectors; Sp(0) ${a[2]!.toFixed(3)}, TPR(d,0) ${a[3]!.toFixed(3)})`;
    case 'ISF':
      return `inverse square (${cm(a[0]!)} / ${cm(a[1]!)})²${f.name ? ` (${f.name})` : ''}`;
    case 'OAR':
      return (
        `OAR(${cm(a[0]!)}, ${cm(a[1]!)}${f.name === 'isocenter-plane' ? ' at the isocenter plane' : ''})` +
        (a.length === 4 ? ` = ${a[2]!.toFixed(4)} on the primary (${(100 * a[3]!).toFixed(0)} % of Sp·TPR)` : '')
      );
    case 'WF':
      return `WF ${f.name}(${a.map(cm).join(', ')})`;
    case 'WP':
      return a.length === 1
        ? `wedge profile ${f.name}(${cm(a[0]!)} toward the heel, at the reference depth)`
        : `wedge profile ${f.name}(${cm(a[0]!)}, ${cm(a[1]!)} toward the heel)`;
    case 'TF':
      return `TF ${f.name}`;
    case 'MCI':
      return `Σ MU share × Sc·Sp·${f.name ?? 'TPR'}·ISF·OAR over ${a[0]} segments (${a[1]} sectors)`;
  }
}
