/**
 * A dataset as an outside reference tool sees it (dcmtk's dcmdump, pydicom), as a plain tree keyed
 * by our dictionary keywords, so the importer's model can be compared with it value by value.
 */
import { spawnSync } from 'node:child_process';
import { ATTRIBUTES } from '../../src/dicom/dictionary.js';
import { runPython } from '../../scripts/lib/find-python.js';

export type RefValue = { readonly vr: string; readonly values: readonly string[] } | { readonly items: readonly RefNode[] };
export type RefNode = ReadonlyMap<string, RefValue>;

const KEYWORD_BY_TAG = new Map(Object.entries(ATTRIBUTES).map(([kw, a]) => [a.tag.slice(1), kw]));
const keywordOf = (groupElement: string) => KEYWORD_BY_TAG.get(groupElement.toLowerCase()) ?? `x${groupElement.toLowerCase()}`;

/** Runs `dcmdump` (UIDs unmapped, long values whole) and parses its indented tree. */
export function dcmdumpTree(file: string): RefNode {
  const r = spawnSync('dcmdump', ['-Un', '+L', file], { encoding: 'utf8', maxBuffer: 64 * 1024 * 1024 });
  if (r.status !== 0) throw new Error(`dcmdump failed on ${file}: ${r.stderr}`);
  return parseDcmdump(r.stdout);
}

const LINE = /^(\s*)\(([0-9a-f]{4}),([0-9a-f]{4})\) (\w\w) (.*?)\s*#\s*(?:\d+|u\/l),\s*\d+ \S+$/;

export function parseDcmdump(text: string): RefNode {
  const root = new Map<string, RefValue>();
  // Stack of open containers: an item map, or a sequence's item list.
  const items: Map<string, RefValue>[] = [root];
  const sequences: RefNode[][] = [];
  for (const line of text.split('\n')) {
    const m = LINE.exec(line);
    if (!m) continue;
    const [, , g, e, vr, rest] = m as unknown as [string, string, string, string, string, string];
    const tag = `${g}${e}`;
    if (tag === 'fffee000') {
      const item = new Map<string, RefValue>();
      sequences[sequences.length - 1]!.push(item);
      items.push(item);
    } else if (tag === 'fffee00d') {
      items.pop();
    } else if (tag === 'fffee0dd') {
      sequences.pop();
    } else if (vr === 'SQ') {
      const list: RefNode[] = [];
      items[items.length - 1]!.set(keywordOf(tag), { items: list });
      sequences.push(list);
    } else {
      const value = rest.startsWith('[') ? rest.slice(1, rest.lastIndexOf(']')) : rest.startsWith('(no value') ? '' : rest.trim();
      items[items.length - 1]!.set(keywordOf(tag), { vr, values: value === '' ? [] : value.split('\\') });
    }
  }
  return root;
}

const PYDICOM_DUMP = `
import json, sys, pydicom
from pydicom.valuerep import DSfloat, IS
def text(x):
    # DS and IS keep the string as written; a PN's original_string is bytes, so use its str().
    o = getattr(x, 'original_string', None)
    return o if isinstance(o, str) and o else str(x)
def conv(ds):
    out = {}
    for el in ds:
        key = 'x%08x' % int(el.tag)
        if el.VR == 'SQ':
            out[key] = {'items': [conv(i) for i in el.value]}
            continue
        v = el.value
        if v is None or v == '' or (isinstance(v, (list, pydicom.multival.MultiValue)) and len(v) == 0):
            vals = []
        elif isinstance(v, (list, pydicom.multival.MultiValue)):
            vals = [text(x) for x in v]
        elif isinstance(v, bytes):
            vals = [v.hex()]
        else:
            vals = [text(v)]
        out[key] = {'vr': el.VR, 'values': vals}
    return out
files = json.loads(sys.argv[1])
res = []
for f in files:
    d = pydicom.dcmread(f)
    tree = conv(d.file_meta) if hasattr(d, 'file_meta') else {}
    tree.update(conv(d))
    res.append(tree)
print(json.dumps(res))
`;

/** Reads files with pydicom (one Python process for all of them) into reference trees. */
export function pydicomTrees(files: readonly string[]): RefNode[] {
  const raw = JSON.parse(runPython(PYDICOM_DUMP, [JSON.stringify(files)])) as Record<string, unknown>[];
  const toNode = (o: Record<string, unknown>): RefNode =>
    new Map(
      Object.entries(o).map(([tag, v]) => {
        const val = v as { items?: Record<string, unknown>[]; vr?: string; values?: string[] };
        return [keywordOf(tag.slice(1)), val.items ? { items: val.items.map(toNode) } : { vr: val.vr!, values: val.values! }] as const;
      }),
    );
  return raw.map(toNode);
}
