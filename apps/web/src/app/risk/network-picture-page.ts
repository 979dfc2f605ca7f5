import { DecimalPipe } from '@angular/common';
import {
  ChangeDetectionStrategy,
  Component,
  DestroyRef,
  ElementRef,
  afterRenderEffect,
  computed,
  inject,
  signal,
  untracked,
  viewChild,
} from '@angular/core';
import { toObservable, toSignal } from '@angular/core/rxjs-interop';
import { MatIconButton } from '@angular/material/button';
import { MatFormField, MatLabel } from '@angular/material/form-field';
import { MatIcon } from '@angular/material/icon';
import { MatInput } from '@angular/material/input';
import { MatProgressBar } from '@angular/material/progress-bar';
import { MatOption, MatSelect } from '@angular/material/select';
import { Router, RouterLink } from '@angular/router';
import type { AnalysisRunDto } from '@keelson/contracts';
import { catchError, map, of, startWith, switchMap } from 'rxjs';
import { NetworkVersionsApi } from '../network/network-versions-api';
import { versionLabel } from '../network/version-label';
import { apiErrorMessage } from '../shared/api-error-message';
import type { NetworkPicture, NetworkPictureNode } from './network-picture-dto';
import { NetworkPictureRenderer, type PictureHandle } from './network-picture-renderer';
import { findPictureNodes } from './picture-search';
import { RiskApi } from './risk-api';

type Loaded<T> = { value: T } | { error: string } | { isLoading: true };

function loaded<T>(value: T): Loaded<T> {
  return { value };
}

/** The run picker's value for "no run": nothing highlighted. */
export const NO_RUN = 0;

/**
 * `/risk`: the whole network of a version in tiers (plants and products right, suppliers
 * leftwards by tier), with a run's single points of failure highlighted; zoom, pan, a search
 * that focuses a node, and a click on a supplier opening its risk page. Above the server's
 * limit the picture comes grouped by tier and country, and the page says so.
 */
@Component({
  selector: 'kl-network-picture-page',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [
    DecimalPipe, MatFormField, MatIcon, MatIconButton, MatInput, MatLabel, MatOption,
    MatProgressBar, MatSelect, RouterLink,
  ],
  templateUrl: './network-picture-page.html',
  styleUrl: './network-picture-page.scss',
})
export class NetworkPicturePage {
  private readonly versionsApi = inject(NetworkVersionsApi);
  private readonly api = inject(RiskApi);
  private readonly renderer = inject(NetworkPictureRenderer);
  private readonly router = inject(Router);

  private readonly canvas = viewChild<ElementRef<HTMLElement>>('canvas');
  private handle: PictureHandle | null = null;
  private drawing = 0;

  private readonly versionsLoaded = toSignal(
    this.versionsApi.list(50).pipe(
      map((page) => loaded(page.items)),
      catchError((error: unknown) => of({ error: apiErrorMessage(error) })),
    ),
    { initialValue: { isLoading: true } as Loaded<never> },
  );
  protected readonly versions = computed(() => {
    const state = this.versionsLoaded();
    return 'value' in state ? state.value : [];
  });
  protected readonly versionLabel = versionLabel;
  private readonly pickedVersion = signal<number | null>(null);
  /** The version drawn: the one picked, else the latest. */
  protected readonly versionId = computed(
    () => this.pickedVersion() ?? this.versions()[0]?.id ?? null,
  );

  private readonly runsLoaded = toSignal(
    toObservable(this.versionId).pipe(
      switchMap((id) =>
        id === null
          ? of<Loaded<AnalysisRunDto[]>>({ isLoading: true })
          : this.api.runsOfVersion(id).pipe(
            map((page) => loaded(page.items.filter((run) => run.status === 'succeeded'))),
            catchError((error: unknown) => of({ error: apiErrorMessage(error) })),
            startWith<Loaded<AnalysisRunDto[]>>({ isLoading: true }),
          ),
      ),
    ),
    { initialValue: { isLoading: true } as Loaded<AnalysisRunDto[]> },
  );
  /** Succeeded runs of the version, newest first. */
  protected readonly runs = computed(() => {
    const state = this.runsLoaded();
    return 'value' in state ? state.value : [];
  });
  private readonly pickedRun = signal<{ version: number; run: number } | null>(null);
  /** The run whose marks are shown: the one picked for this version, else the latest. */
  protected readonly runId = computed(() => {
    const version = this.versionId();
    const picked = this.pickedRun();
    if (picked && picked.version === version) return picked.run;
    return this.runs()[0]?.id ?? NO_RUN;
  });

  private readonly pictureLoaded = toSignal(
    toObservable(computed(() => {
      const version = this.versionId();
      // Wait for the runs: the default run is the latest succeeded one.
      if (version === null || 'isLoading' in this.runsLoaded()) return null;
      return { version, run: this.runId() };
    }, { equal: (a, b) => a?.version === b?.version && a?.run === b?.run })).pipe(
      switchMap((request) =>
        request === null
          ? of<Loaded<NetworkPicture>>({ isLoading: true })
          : this.api.picture(request.version, request.run === NO_RUN ? null : request.run).pipe(
            map((picture) => loaded(picture)),
            catchError((error: unknown) => of({ error: apiErrorMessage(error) })),
            startWith<Loaded<NetworkPicture>>({ isLoading: true }),
          ),
      ),
    ),
    { initialValue: { isLoading: true } as Loaded<NetworkPicture> },
  );
  protected readonly picture = computed(() => {
    const state = this.pictureLoaded();
    return 'value' in state ? state.value : null;
  });
  protected readonly error = computed(() => {
    for (const state of [this.versionsLoaded(), this.runsLoaded(), this.pictureLoaded()]) {
      if ('error' in state) return state.error;
    }
    return null;
  });
  protected readonly isLoading = computed(
    () => 'isLoading' in this.pictureLoaded() && this.error() === null && this.hasVersions(),
  );
  protected readonly hasVersions = computed(() => {
    const state = this.versionsLoaded();
    return !('value' in state) || state.value.length > 0;
  });
  protected readonly singlePointNodes = computed(() =>
    (this.picture()?.nodes ?? []).filter((node) => node.isSinglePoint),
  );

  protected readonly query = signal('');
  protected readonly searchMessage = signal<string | null>(null);
  protected readonly selected = signal<NetworkPictureNode | null>(null);

  constructor() {
    // After rendering, so the canvas element is shown and sized when cytoscape measures it.
    afterRenderEffect(() => {
      const picture = this.picture();
      const canvas = this.canvas()?.nativeElement;
      untracked(() => void this.draw(canvas ?? null, picture));
    });
    inject(DestroyRef).onDestroy(() => {
      this.drawing++;
      this.handle?.destroy();
      this.handle = null;
    });
  }

  protected pickVersion(id: number): void {
    this.pickedVersion.set(id);
    this.selected.set(null);
  }

  protected pickRun(run: number): void {
    const version = this.versionId();
    if (version !== null) this.pickedRun.set({ version, run });
  }

  protected search(text: string): void {
    this.query.set(text);
    const matches = findPictureNodes(this.picture()?.nodes ?? [], text);
    if (text.trim() === '') {
      this.searchMessage.set(null);
      return;
    }
    const first = matches[0];
    if (!first) {
      this.searchMessage.set(`Nothing in this picture matches "${text.trim()}".`);
      return;
    }
    this.handle?.focus(first.id);
    this.selected.set(first);
    this.searchMessage.set(
      matches.length === 1
        ? `Showing ${first.label}.`
        : `${matches.length} nodes match; showing ${first.label}.`,
    );
  }

  protected zoom(factor: number): void {
    this.handle?.zoomBy(factor);
  }

  protected fit(): void {
    this.handle?.fit();
  }

  /** Where a supplier opens: its risk page in the run, or its network page without one. */
  protected supplierLink(code: string): unknown[] {
    const run = this.runId();
    return run === NO_RUN
      ? ['/network', this.versionId(), 'suppliers', code]
      : ['/risk', run, 'suppliers', code];
  }

  private async draw(canvas: HTMLElement | null, picture: NetworkPicture | null): Promise<void> {
    const ticket = ++this.drawing;
    this.handle?.destroy();
    this.handle = null;
    if (!canvas || !picture) return;
    const handle = await this.renderer.render(canvas, picture, {
      nodeSelected: (node) => this.onNodeSelected(node),
    });
    if (ticket !== this.drawing) {
      handle.destroy();
      return;
    }
    this.handle = handle;
  }

  private onNodeSelected(node: NetworkPictureNode): void {
    this.selected.set(node);
    if (node.kind === 'supplier') void this.router.navigate(this.supplierLink(node.code));
  }
}
