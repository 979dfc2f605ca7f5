import { Injectable, InjectionToken, inject } from '@angular/core';
import type { AnalysisRunDto, RunProgressEvent, RunStatus } from '@keelson/contracts';
import { Observable, catchError, map, switchMap, takeWhile, timer } from 'rxjs';
import { RunsApi } from './runs-api';

/** How often a run is polled when its event stream cannot be used. */
export const RUN_POLL_INTERVAL_MS = 2000;

/** The statuses after which a run changes no more. */
export const FINISHED_STATUSES: readonly RunStatus[] = ['succeeded', 'failed', 'cancelled'];

/** True when a run in this status will change no more. */
export function isFinished(status: RunStatus): boolean {
  return FINISHED_STATUSES.includes(status);
}

/** Opens a server-sent event stream; a token so specs can hand in a scripted stand-in. */
export const EVENT_SOURCE_FACTORY = new InjectionToken<(url: string) => EventSource>(
  'EVENT_SOURCE_FACTORY',
  { providedIn: 'root', factory: () => (url) => new EventSource(url, { withCredentials: true }) },
);

/** The progress fields of a run as an event of the stream. */
export function progressOf(run: AnalysisRunDto): RunProgressEvent {
  return {
    id: run.id,
    status: run.status,
    progress: run.progress,
    stage: run.stage,
    error: run.error,
  };
}

/**
 * Follows one run until it finishes: the server's `progress` events while the stream works,
 * then `GET /api/analysis-runs/:id` every {@link RUN_POLL_INTERVAL_MS} if the stream fails (a
 * proxy that buffers, a dropped connection). The stream is closed on unsubscribe and after the
 * last event; the observable completes once the run has finished.
 */
@Injectable({ providedIn: 'root' })
export class RunProgress {
  private readonly runsApi = inject(RunsApi);
  private readonly openEventSource = inject(EVENT_SOURCE_FACTORY);

  /** The progress of run `id`, ending with its final status. */
  watch(id: number): Observable<RunProgressEvent> {
    return this.stream(id).pipe(catchError(() => this.poll(id)));
  }

  private stream(id: number): Observable<RunProgressEvent> {
    return new Observable<RunProgressEvent>((subscriber) => {
      const source = this.openEventSource(this.runsApi.eventsUrl(id));
      source.addEventListener('progress', (message: MessageEvent<string>) => {
        let event: RunProgressEvent;
        try {
          event = JSON.parse(message.data) as RunProgressEvent;
        } catch {
          source.close();
          subscriber.error(new Error(`Run ${id}: unreadable progress event.`));
          return;
        }
        subscriber.next(event);
        if (isFinished(event.status)) {
          source.close();
          subscriber.complete();
        }
      });
      // EventSource would retry on its own forever; polling is the plainer fallback.
      source.onerror = () => {
        source.close();
        subscriber.error(new Error(`Run ${id}: the progress stream failed.`));
      };
      return () => source.close();
    });
  }

  private poll(id: number): Observable<RunProgressEvent> {
    return timer(0, RUN_POLL_INTERVAL_MS).pipe(
      switchMap(() => this.runsApi.get(id)),
      map(progressOf),
      takeWhile((event) => !isFinished(event.status), true),
    );
  }
}
