import type { Role } from '@keelson/contracts';

/** One card on the home page: a piece of work this role does in Keelson. */
export interface RoleTask {
  readonly icon: string;
  readonly title: string;
  /** What this work is, in one or two sentences. */
  readonly body: string;
  /** What the card says while there is nothing to show yet, and what to do first. */
  readonly emptyState: string;
  /** A page that exists today; omitted while the feature is still to come (no dead links). */
  readonly link?: { readonly path: string; readonly label: string };
}

/** What the home page tells one role. */
export interface RoleGuide {
  /** The role explained in one sentence. */
  readonly summary: string;
  readonly tasks: readonly RoleTask[];
}

/** The home page's content per role. */
export const ROLE_GUIDES: Readonly<Record<Role, RoleGuide>> = {
  admin: {
    summary:
      'As administrator you decide who works in Keelson, with which role, and for which plants.',
    tasks: [
      {
        icon: 'manage_accounts',
        title: 'People and roles',
        body: 'Invite colleagues, give each one a role, assign plant managers to their plants.',
        emptyState: 'First step: invite a buyer, who imports the supplier network.',
        link: { path: '/admin/users', label: 'Open users' },
      },
      {
        icon: 'outgoing_mail',
        title: 'Sent mail',
        body: 'Invitations and notices this server sent, as the recipients see them.',
        emptyState: 'After inviting someone, check here that the invitation went out.',
        link: { path: '/admin/mail', label: 'Open sent mail' },
      },
    ],
  },
  buyer: {
    summary:
      'As buyer you bring the supplier network into Keelson from your purchasing spreadsheets.',
    tasks: [
      {
        icon: 'upload_file',
        title: 'Import suppliers',
        body: 'Suppliers, the parts they deliver, the plants they serve and where they produce.',
        emptyState: 'No network imported yet — importing arrives soon.',
      },
      {
        icon: 'hub',
        title: 'Check the network',
        body: 'See which suppliers depend on which sub-suppliers, tier by tier.',
        emptyState: 'The network view fills once a spreadsheet has been imported.',
      },
    ],
  },
  risk_manager: {
    summary:
      'As risk manager you review where one supplier failing would stop production, ' +
      'and score the risks in the register.',
    tasks: [
      {
        icon: 'leaderboard',
        title: 'Single points of failure',
        body: 'A ranking of suppliers whose loss would reach the most plants and parts.',
        emptyState: 'Nothing to rank yet: the ranking appears after a buyer imports a network.',
      },
      {
        icon: 'fact_check',
        title: 'Risk register',
        body: 'Score likelihood and impact, record owners, ask plants for mitigation plans.',
        emptyState: 'The register opens with the ranking; there are no entries yet.',
      },
    ],
  },
  plant_manager: {
    summary:
      'As plant manager you approve the mitigation plans that concern your own plants.',
    tasks: [
      {
        icon: 'task_alt',
        title: 'Approvals',
        body: 'Plans proposed for your plants, waiting for your decision.',
        emptyState: 'Nothing is waiting for you: approvals arrive with the risk register.',
      },
      {
        icon: 'factory',
        title: 'Your plants',
        body: 'Which suppliers your plants depend on, and which of them stand alone.',
        emptyState: 'Your plants\u2019 suppliers show once a buyer has imported a network.',
      },
    ],
  },
  viewer: {
    summary:
      'As viewer you can read the network, the ranking and the register, without changing them.',
    tasks: [
      {
        icon: 'visibility',
        title: 'Read the findings',
        body: 'The supplier network, the single-point-of-failure ranking and the risk register.',
        emptyState: 'Nothing to read yet: the first results appear after a network is imported.',
      },
    ],
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
