import type { Role } from '@keelson/contracts';

/** What the home page tells one role about itself. */
export interface RoleGuide {
  /** The role explained in one sentence. */
  readonly summary: string;
}

/** The role line of the home page, per role; the dashboard's cards follow it. */
export const ROLE_GUIDES: Readonly<Record<Role, RoleGuide>> = {
  admin: {
    summary: 'As administrator you decide who works in Keelson, with which role, and for ' +
      'which plants, and you see what the risk managers see.',
  },
  buyer: {
    summary:
      'As buyer you bring the supplier network into Keelson from your purchasing spreadsheets.',
  },
  risk_manager: {
    summary: 'As risk manager you review where one supplier failing would stop production, ' +
      'score the risks in the register and draft the plans against them.',
  },
  plant_manager: {
    summary: 'As plant manager you see the risks at your plants and approve the mitigation ' +
      'plans that concern them.',
  },
  viewer: {
    summary:
      'As viewer you can read the network, the ranking and the register, without changing them.',
  },
};

/** "Good morning" / "Good afternoon" / "Good evening" for an hour of the day (0-23). */
export function greetingFor(hour: number): string {
  if (!Number.isInteger(hour) || hour < 0 || hour > 23) {
    throw new RangeError(`greetingFor: hour must be an integer 0-23, got ${hour}.`);
  }
  if (hour < 12) {
    return 'Good morning';
  }
  return hour < 18 ? 'Good afternoon' : 'Good evening';
}
