/**
 * Is the payment provider answering? Used to tell people on the Purchases page before they
 * try to buy, and to tell "could not ask" apart from "asked and was told no".
 */
import { getStripe } from './stripe';

/** True for errors that mean the provider did not answer (no connection, timeout, its own 5xx). */
export function providerUnreachable(e: unknown): boolean {
  const err = e as { type?: string; statusCode?: number };
  return err?.type === 'StripeConnectionError' || err?.type === 'StripeAPIError' || (typeof err?.statusCode === 'number' && err.statusCode >= 500);
}

let last: { ok: boolean; at: number } | undefined;

/**
 * Asks the provider for a session that does not exist: any API answer (404 included) means
 * it is reachable. Remembered for 30 s when it answered, 5 s when it did not.
 */
export async function paymentProviderReachable(): Promise<boolean> {
  const now = Date.now();
  if (last && now - last.at < (last.ok ? 30_000 : 5_000)) return last.ok;
  let ok: boolean;
  try {
    await getStripe().checkout.sessions.retrieve('cs_reachability_probe', {}, { maxNetworkRetries: 0, timeout: 3000 });
    ok = true;
  } catch (e) {
    ok = !providerUnreachable(e);
  }
  last = { ok, at: Date.now() };
  return ok;
}

/** Records what a real call just learned, so the page and the API agree. */
export function noteProvider(ok: boolean): void {
  last = { ok, at: Date.now() };
}
