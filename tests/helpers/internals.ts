/**
 * What a message must never show: a library's function names, a JavaScript error class, a stack
 * frame, an undefined where a value should be (project rule: messages in our words).
 */
export const INTERNALS =
  /dicomParser|littleEndian|bigEndian|ByteArrayParser|readUint|maxPosition|RangeError|TypeError|ReferenceError|SyntaxError|\bat .*\.(js|ts|mjs):\d+|\bundefined\b|\bNaN\b|\[object Object\]/;
