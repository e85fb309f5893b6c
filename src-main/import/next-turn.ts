/** Lets the event loop run (a cancel call, a progress message to the page) before more synchronous work. */
export function nextTurn(): Promise<void> {
  return new Promise((resolve) => setImmediate(resolve));
}
