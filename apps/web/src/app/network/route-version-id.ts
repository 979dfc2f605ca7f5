import { type Signal, inject } from '@angular/core';
import { toSignal } from '@angular/core/rxjs-interop';
import { ActivatedRoute } from '@angular/router';
import { map } from 'rxjs';

/**
 * The `:versionId` of the nearest route that has one (this route or a parent), as a signal
 * that follows the URL when the version picker switches versions under a reused component.
 * Call it in an injection context; NaN when no route on the path has the parameter.
 */
export function routeVersionId(): Signal<number> {
  const route = inject(ActivatedRoute);
  const owner =
    [...route.pathFromRoot].reverse().find((candidate) =>
      candidate.snapshot.paramMap.has('versionId'),
    ) ?? route;
  return toSignal(owner.paramMap.pipe(map((params) => Number(params.get('versionId')))), {
    requireSync: true,
  });
}
