import { renameSync, writeFileSync, mkdirSync } from 'node:fs';
import { dirname } from 'node:path';
import dcmjs from 'dcmjs';

const { DicomDict, DicomMetaDictionary } = dcmjs.data;

// dcmjs's dictionary still calls these three "RETIRED_…" and would silently drop them on write.
for (const [tag, name] of [
  ['(300A,0088)', 'BeamDosePointDepth'],
  ['(300A,0089)', 'BeamDosePointEquivalentDepth'],
  ['(300A,008A)', 'BeamDosePointSSD'],
] as const) {
  const D = DicomMetaDictionary.dictionary;
  const N = DicomMetaDictionary.nameMap;
  delete N[D[tag].name];
  D[tag] = N[name] = { tag, vr: 'FL', vm: '1', name, version: 'DICOM' };
}

export const RT_PLAN_STORAGE = '1.2.840.10008.5.1.4.1.1.481.5';
export const EXPLICIT_VR_LE = '1.2.840.10008.1.2.1';
const IMPLEMENTATION_CLASS_UID = '2.25.302329402418290476573478021862545217187';

/** Every keyword must be known to the dictionary: dcmjs would otherwise drop it with only a console warning. */
function assertKnownKeywords(obj: unknown, path = ''): void {
  if (Array.isArray(obj)) return obj.forEach((x, i) => assertKnownKeywords(x, `${path}[${i}]`));
  if (obj && typeof obj === 'object' && !(obj instanceof ArrayBuffer)) {
    for (const [k, v] of Object.entries(obj)) {
      if (k === '_vrMap') continue;
      if (!(k in DicomMetaDictionary.nameMap)) throw new Error(`unknown DICOM keyword ${path}.${k}`);
      if (typeof v === 'object') assertKnownKeywords(v, `${path}.${k}`);
    }
  }
}

/** Writes a naturalized dataset as a Part-10 file in explicit VR little endian, atomically. */
export function writeDataset(file: string, dataset: Record<string, unknown>, sopClassUid: string): void {
  mkdirSync(dirname(file), { recursive: true });
  const tmp = `${file}.tmp`;
  writeFileSync(tmp, datasetBytes(dataset, sopClassUid));
  renameSync(tmp, file);
}

/** A naturalized dataset as the bytes of a Part-10 file in explicit VR little endian. */
export function datasetBytes(dataset: Record<string, unknown>, sopClassUid: string): Buffer {
  assertKnownKeywords(dataset);
  const meta = {
    FileMetaInformationVersion: new Uint8Array([0, 1]).buffer,
    MediaStorageSOPClassUID: sopClassUid,
    MediaStorageSOPInstanceUID: dataset.SOPInstanceUID,
    TransferSyntaxUID: EXPLICIT_VR_LE,
    ImplementationClassUID: IMPLEMENTATION_CLASS_UID,
    ImplementationVersionName: 'PLUMBLINE_0_1',
  };
  const dict = new DicomDict(DicomMetaDictionary.denaturalizeDataset(meta));
  dict.dict = DicomMetaDictionary.denaturalizeDataset(dataset);
  return Buffer.from(dict.write() as ArrayBuffer);
}

/**
 * Deterministic UIDs under the 2.25 root (a UUID-derived decimal), so regenerated fixtures are
 * byte-identical and diffs show real changes only.
 */
export function fixtureUid(seed: string): string {
  let h = 0xcbf29ce484222325n;
  for (const c of Buffer.from(seed)) h = ((h ^ BigInt(c)) * 0x100000001b3n) & 0xffffffffffffffffn;
  let h2 = 0x84222325cbf29ce4n;
  for (const c of Buffer.from(`${seed}#`)) h2 = ((h2 ^ BigInt(c)) * 0x100000001b3n) & 0xffffffffffffffffn;
  return `2.25.${((h << 64n) | h2).toString()}`;
}
