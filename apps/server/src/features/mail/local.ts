import type { Config } from '../../config';

const LOCAL_KEY = /^sk_test_local/;

/**
 * Whether the local SMTP capture server and fake payment API stand in for the hosted services. Explicit
 * `LOCAL_FAKES` wins; otherwise they are on unless this is production with a real payment key.
 */
export function localFakesOn(config: Pick<Config, 'LOCAL_FAKES' | 'NODE_ENV' | 'PAYMENTS_SECRET_KEY'>): boolean {
  if (config.LOCAL_FAKES) return config.LOCAL_FAKES === '1';
  return !(config.NODE_ENV === 'production' && !LOCAL_KEY.test(config.PAYMENTS_SECRET_KEY));
}
