import { ChangeDetectionStrategy, Component, inject, input } from '@angular/core';
import { MatIconButton } from '@angular/material/button';
import { MatIcon } from '@angular/material/icon';
import { MatMenu, MatMenuItem, MatMenuTrigger } from '@angular/material/menu';
import { MatSnackBar } from '@angular/material/snack-bar';
import { MatTooltip } from '@angular/material/tooltip';
import { exportCsv, exportPng, exportSvg, type ChartTable } from './chart-export';

/** The export button every chart carries: the drawing as PNG or SVG, the data as CSV. */
@Component({
  selector: 'qb-chart-export-menu',
  imports: [MatIcon, MatIconButton, MatMenu, MatMenuItem, MatMenuTrigger, MatTooltip],
  template: `
    <button mat-icon-button [matMenuTriggerFor]="menu" matTooltip="Export" [attr.aria-label]="'Export ' + fileName()">
      <mat-icon>download</mat-icon>
    </button>
    <mat-menu #menu="matMenu">
      <button mat-menu-item (click)="savePng()" [disabled]="!svg()">PNG image</button>
      <button mat-menu-item (click)="saveSvg()" [disabled]="!svg()">SVG drawing</button>
      <button mat-menu-item (click)="saveCsv()">CSV data</button>
    </mat-menu>
  `,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class ChartExportMenu {
  private readonly snackBar = inject(MatSnackBar);

  readonly svg = input.required<SVGSVGElement | undefined>();
  /** Read only when the CSV is asked for: a chart's table can be long. */
  readonly table = input.required<() => ChartTable>();
  readonly fileName = input.required<string>();

  protected savePng(): void {
    const svg = this.svg();
    if (svg === undefined) return;
    exportPng(svg, this.fileName()).catch((error: unknown) =>
      this.snackBar.open(error instanceof Error ? error.message : 'The PNG could not be made', 'Close', { duration: 8000, panelClass: 'qb-snack-error' }),
    );
  }

  protected saveSvg(): void {
    const svg = this.svg();
    if (svg !== undefined) exportSvg(svg, this.fileName());
  }

  protected saveCsv(): void {
    exportCsv(this.table()(), this.fileName());
  }
}
