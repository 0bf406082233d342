/**
 * When a failed delivery is tried again: 10 s · 2^(attempt − 1), capped at 15 min — an SMTP
 * server that is down for a restart is retried within seconds, one that is down all night is not
 * hammered. After `maxAttempts` the delivery is 'failed' and waits for a person to resend it.
 */
export interface RetryPolicy {
  baseDelayMs: number
  maxDelayMs: number
  maxAttempts: number
}

export const DEFAULT_RETRY: RetryPolicy = {
  baseDelayMs: 10_000,
  maxDelayMs: 15 * 60_000,
  // 10 s, 20 s, 40 s, … 15 min: 12 attempts span about an hour and a half.
  maxAttempts: 12,
}

export function retryDelayMs(attempts: number, policy: RetryPolicy = DEFAULT_RETRY): number {
  const exponent = Math.max(0, attempts - 1)
  return Math.min(policy.maxDelayMs, policy.baseDelayMs * 2 ** Math.min(exponent, 30))
}
