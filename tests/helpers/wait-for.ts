/** Polls a condition (which may ask the history, asynchronously) until it holds or the time is up; its last answer. */
export async function waitFor(test: () => boolean | Promise<boolean>, ms: number, stepMs = 20): Promise<boolean> {
  const end = Date.now() + ms;
  while (!(await test()) && Date.now() < end) await new Promise((r) => setTimeout(r, stepMs));
  return test();
}
