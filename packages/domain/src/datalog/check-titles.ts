import type { CheckId } from './report';

/** What each log check is called on screen and in reports. */
export const CHECK_TITLES: Record<CheckId, string> = {
  required_channels: 'Requested channels',
  engine_warm: 'Engine warm',
  full_throttle: 'Full throttle',
  wot_gears: 'Full-throttle gears',
  sensor_sanity: 'Sensors',
  afr_scale: 'Air-fuel ratio scale',
  bank_split: 'Bank 1 against bank 2',
};

/** A stored check id's title; an id from a newer analysis than this code shows as itself. */
export const checkTitle = (id: string): string => (CHECK_TITLES as Record<string, string>)[id] ?? id;
