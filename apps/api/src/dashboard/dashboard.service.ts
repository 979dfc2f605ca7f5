/**
 * The home dashboard: which figures each role gets. Risk managers and administrators see the
 * whole register and every plan; plant managers their plants and the plans waiting for them;
 * buyers the last import; viewers the register's open entries and the last run.
 */
import { RATING_BANDS, type DashboardDto, type RatingBand } from '@keelson/contracts';
import type { SessionUser } from '../http/auth-context';
import { plantScopeOf } from '../network/plant-scope';
import { todayOf } from '../plans/plan-rules';
import type { DashboardRepository } from './dashboard.repository';

/** How many of a plant manager's risks the dashboard lists. */
export const TOP_RISKS_LIMIT = 5;

/** What the dashboard service needs. */
export interface DashboardServiceDeps {
  repository: DashboardRepository;
  now: () => Date;
}

const zeroBands = (): Record<RatingBand, number> =>
  Object.fromEntries(RATING_BANDS.map((band) => [band, 0])) as Record<RatingBand, number>;

/** Builds {@link DashboardDto} for a signed-in user. */
export class DashboardService {
  constructor(private readonly deps: DashboardServiceDeps) {}

  /** The figures of the user's role; the figures of other roles are null. */
  forUser(user: SessionUser): DashboardDto {
    const { repository } = this.deps;
    const today = todayOf(this.deps.now());
    const dto: DashboardDto = {
      role: user.role,
      hasNetwork: repository.hasNetwork(),
      openEntriesByBand: null,
      entriesByStatus: null,
      lastRun: null,
      lastRescoring: null,
      plansAwaitingApproval: null,
      overdueTasks: null,
      myOverdueTasks: null,
      unsentMail: null,
      topRisks: null,
      lastImport: null,
    };
    const role = user.role;
    if (role === 'risk_manager' || role === 'admin') {
      Object.assign(dto, this.bands(null));
      dto.lastRun = repository.lastRun();
      dto.lastRescoring = repository.lastRescoring();
      dto.plansAwaitingApproval = repository.submittedPlans();
      dto.overdueTasks = repository.overdueTasks({ today });
      dto.myOverdueTasks = repository.overdueTasks({ today, ownerId: user.id });
      if (role === 'admin') {
        dto.lastImport = repository.lastImport();
        dto.unsentMail = repository.unsentMail();
      }
    } else if (role === 'plant_manager') {
      const plants = plantScopeOf(user) ?? [];
      Object.assign(dto, this.bands(plants));
      const top = repository.topRisks(plants, TOP_RISKS_LIMIT);
      const plantsOf = repository.plantsOf(top.map((risk) => risk.id));
      dto.topRisks = top.map((risk) => ({ ...risk, plants: plantsOf.get(risk.id) ?? [] }));
      dto.plansAwaitingApproval = repository.plansAwaitingDecision(user.id, plants);
      dto.overdueTasks = repository.overdueTasks({ today, ownerId: user.id });
    } else if (role === 'buyer') {
      dto.lastImport = repository.lastImport();
    } else {
      Object.assign(dto, this.bands(null));
      dto.lastRun = repository.lastRun();
    }
    return dto;
  }

  /** Live entries by band, in total and per status. */
  private bands(plants: readonly string[] | null):
    Pick<DashboardDto, 'openEntriesByBand' | 'entriesByStatus'> {
    const total = zeroBands();
    const byStatus = { open: zeroBands(), mitigating: zeroBands() };
    for (const row of this.deps.repository.bandCounts(plants)) {
      total[row.ratingBand] += row.entries;
      byStatus[row.status][row.ratingBand] += row.entries;
    }
    return { openEntriesByBand: total, entriesByStatus: byStatus };
  }
}
