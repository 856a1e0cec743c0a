import { ChangeDetectionStrategy, Component, computed, inject, input } from '@angular/core';
import { rxResource } from '@angular/core/rxjs-interop';
import { MatFormField, MatLabel } from '@angular/material/form-field';
import { MatIcon } from '@angular/material/icon';
import { MatProgressBar } from '@angular/material/progress-bar';
import { MatOption, MatSelect } from '@angular/material/select';
import { Router, RouterLink } from '@angular/router';
import { forkJoin, of } from 'rxjs';
import { problemFrom } from '../core/http/api-problem';
import { DesignsApi } from '../designs/designs-api';
import { CompareView } from './compare-view';

function versionNumber(text: string | undefined): number | null {
  const value = Number(text);
  return text !== undefined && Number.isInteger(value) && value >= 1 ? value : null;
}

/** Two versions of a design compared: /designs/:id/compare?from=N&to=M, the previous and the latest unless told. */
@Component({
  selector: 'qb-compare-page',
  imports: [CompareView, MatFormField, MatIcon, MatLabel, MatOption, MatProgressBar, MatSelect, RouterLink],
  templateUrl: './compare-page.html',
  styleUrl: './compare-page.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class ComparePage {
  private readonly designs = inject(DesignsApi);
  private readonly router = inject(Router);

  readonly id = input.required<string>();
  readonly from = input<string>();
  readonly to = input<string>();

  protected readonly summary = rxResource({
    params: () => this.id(),
    stream: ({ params }) => forkJoin({ design: this.designs.get(params), versions: this.designs.versions(params) }),
  });
  protected readonly versions = computed(() => (this.summary.hasValue() ? this.summary.value().versions : []));
  protected readonly toNumber = computed(() => versionNumber(this.to()) ?? this.versions().at(0)?.number ?? null);
  protected readonly fromNumber = computed(() => {
    const asked = versionNumber(this.from());
    if (asked !== null) return asked;
    const to = this.toNumber();
    return to === null ? null : Math.max(1, to - 1);
  });

  protected readonly pair = rxResource({
    params: () => ({ id: this.id(), from: this.fromNumber(), to: this.toNumber() }),
    stream: ({ params }) =>
      params.from === null || params.to === null
        ? of(null)
        : forkJoin({ older: this.designs.version(params.id, params.from), newer: this.designs.version(params.id, params.to) }),
  });

  protected readonly loadError = computed(() => {
    const error = this.summary.error() ?? this.pair.error();
    return error ? problemFrom(error).detail : null;
  });

  protected choose(which: 'from' | 'to', number: number): void {
    void this.router.navigate([], { queryParams: { from: this.fromNumber(), to: this.toNumber(), [which]: number }, replaceUrl: true });
  }
}
