import type { FarmAddress } from '../schemas/farm';

/**
 * Where planned runs are delivered until the studio saves its own workshop address in the sales settings: the demo
 * studio's workshop (an invented address).
 */
export const DEFAULT_WORKSHOP_ADDRESS: FarmAddress = {
  name: 'Fernhollow Studio workshop',
  line1: '12 Mill Yard',
  line2: '',
  city: 'Lowmoor',
  region: '',
  postalCode: 'LM3 4QR',
  country: 'GB',
};
