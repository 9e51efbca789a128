import { createHash } from 'node:crypto';
import { datasetOffset } from '../dicom/index.js';

/**
 * SHA-256 of the data set as it was sent: the bytes after the file meta group. A receiver writes a
 * meta group of its own, so this, not the file's hash, matches the exported file's data set.
 */
export function datasetSha256(bytes: Uint8Array): string {
  return createHash('sha256')
    .update(bytes.subarray(datasetOffset(bytes)))
    .digest('hex');
}
