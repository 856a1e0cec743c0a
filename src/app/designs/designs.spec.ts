import { TestBed } from '@angular/core/testing';
import { Designs } from './designs';

describe('Designs', () => {
  it('should say that there are no designs yet and that the workbench is coming', async () => {
    const fixture = TestBed.createComponent(Designs);
    await fixture.whenStable();
    const text: string = fixture.nativeElement.textContent;
    expect(text).toContain('No designs yet');
    expect(text).toContain('The design workbench is coming');
    expect(fixture.nativeElement.querySelectorAll('table, li').length).toBe(0);
  });
});
