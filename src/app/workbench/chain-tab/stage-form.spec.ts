import { provideHttpClient } from '@angular/common/http';
import { provideHttpClientTesting } from '@angular/common/http/testing';
import { ComponentFixture, TestBed } from '@angular/core/testing';
import { ErrorStateMatcher } from '@angular/material/core';
import { lowPassModule } from '@shared/engine/stages/low-pass';
import { EditedErrorStateMatcher } from '../edited-error-state';
import { createStageGroup, type StageGroupOf } from '../design-form';
import { StageForm } from './stage-form';

describe('StageForm', () => {
  let fixture: ComponentFixture<StageForm>;
  let group: StageGroupOf<'lowPass'>;
  let element: HTMLElement;

  beforeEach(async () => {
    TestBed.configureTestingModule({
      imports: [StageForm],
      // As on the workbench: a field says what is wrong while it is typed in.
      providers: [provideHttpClient(), provideHttpClientTesting(), { provide: ErrorStateMatcher, useClass: EditedErrorStateMatcher }],
    });
    group = createStageGroup(lowPassModule.defaults('lp')) as StageGroupOf<'lowPass'>;
    fixture = TestBed.createComponent(StageForm);
    fixture.componentRef.setInput('group', group);
    fixture.componentRef.setInput('index', 4);
    fixture.componentRef.setInput('canRemove', true);
    await fixture.whenStable();
    element = fixture.nativeElement;
  });

  function field(path: string): HTMLInputElement {
    const input = element.querySelector<HTMLInputElement>(`[data-path="${path}"]`);
    if (input === null) throw new Error(`no field ${path}`);
    return input;
  }

  async function type(path: string, text: string): Promise<void> {
    const input = field(path);
    input.value = text;
    input.dispatchEvent(new Event('input'));
    await fixture.whenStable();
  }

  it('should show the low-pass fields with their document paths', () => {
    expect(element.querySelector('h3')?.textContent).toBe('Low-pass');
    expect(field('chain[4].corner').value).toBe('500 Hz');
    expect(field('chain[4].order').value).toBe('2');
    expect(field('chain[4].outputSwing[1]').value).toBe('4.9 V');
  });

  it('should accept orders 1 to 4 only and say so in place', async () => {
    await type('chain[4].order', '5');
    expect(group.valid).toBeFalse();
    expect(element.querySelector('mat-error')?.textContent?.trim()).toBe('Must be at most 4');
    await type('chain[4].order', '0');
    expect(element.querySelector('mat-error')?.textContent?.trim()).toBe('Must be at least 1');
    await type('chain[4].order', '2.5');
    expect(element.querySelector('mat-error')?.textContent?.trim()).toBe('Must be a whole number');
    await type('chain[4].order', '3');
    expect(group.valid).toBeTrue();
    expect(element.querySelector('mat-error')).toBeNull();
  });

  it('should emit each change as the group value, in SI units', async () => {
    const values: unknown[] = [];
    group.valueChanges.subscribe((value) => values.push(value));
    await type('chain[4].order', '3');
    await type('chain[4].corner', '1.2 kHz');
    expect(values.length).toBe(2);
    expect(values[1]).toEqual(jasmine.objectContaining({ id: 'lp', kind: 'lowPass', order: 3, corner: 1200 }));
  });

  it('should offer only the moves it is told the placement rules allow', async () => {
    const [up, down, remove] = Array.from(element.querySelectorAll<HTMLButtonElement>('.stage-header button'));
    expect(up.disabled).toBeTrue();
    expect(down.disabled).toBeTrue();
    expect(remove.disabled).toBeFalse();
    let removed = 0;
    fixture.componentInstance.remove.subscribe(() => removed++);
    remove.click();
    expect(removed).toBe(1);
  });
});
