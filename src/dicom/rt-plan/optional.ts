/** `{ key: value }` when the value is defined, else `{}`: keeps absent attributes absent in the model. */
export function opt<K extends string, V>(key: K, value: V | undefined): Partial<Record<K, V>> {
  return value === undefined ? {} : ({ [key]: value } as Record<K, V>);
}
