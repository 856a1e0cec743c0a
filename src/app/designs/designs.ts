import { ChangeDetectionStrategy, Component } from '@angular/core';
import { MatIcon } from '@angular/material/icon';

/** The list of designs; empty until the design workbench arrives. */
@Component({
  selector: 'qb-designs',
  imports: [MatIcon],
  templateUrl: './designs.html',
  styleUrl: './designs.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class Designs {}
