/** A trend that cannot be computed as asked: a stable code and a sentence naming the place and the fix. */
export class TrendError extends Error {
  constructor(
    readonly code: string,
    message: string,
  ) {
    super(message);
    this.name = 'TrendError';
  }
}
