/** Retry with exponential backoff. The waiting is injected, so that tests never sleep. */

export type Delay = (ms: number) => Promise<void>;

export const realDelay: Delay = (ms) => new Promise((resolve) => setTimeout(resolve, ms));

/**
 * Call `fn` up to `attempts` times, waiting baseDelayMs, 2×, 4×… between tries. `retryable` decides whether an error
 * is worth another try (default: all). Throws the last error.
 */
export async function withRetry<T>(
  fn: (attempt: number) => Promise<T>,
  options: { attempts: number; baseDelayMs: number; delay?: Delay; retryable?: (error: unknown) => boolean },
): Promise<T> {
  const delay = options.delay ?? realDelay;
  let lastError: unknown;
  for (let attempt = 1; attempt <= options.attempts; attempt++) {
    try {
      return await fn(attempt);
    } catch (error) {
      lastError = error;
      if (attempt === options.attempts || (options.retryable && !options.retryable(error))) break;
      await delay(options.baseDelayMs * 2 ** (attempt - 1));
    }
  }
  throw lastError;
}
