import { TestBed } from '@angular/core/testing';
import { About } from './about';

describe('About', () => {
  it('should carry the caution about medical devices and the standards to meet', async () => {
    const fixture = TestBed.createComponent(About);
    await fixture.whenStable();
    const caution: string = fixture.nativeElement.querySelector('[data-testid="caution"]').textContent.replace(/\s+/g, ' ');
    for (const phrase of [
      'may end up in medical devices (infusion, dosing)',
      'engineering estimates to be verified on hardware',
      'IEC 60601-1 for electrical safety including patient leakage currents',
      'ISO 14971 for risk management',
      'IEC 62304 for device software',
      "manufacturer's quality system",
      'defer to local regulations and qualified, licensed practice',
    ]) {
      expect(caution).toContain(phrase);
    }
  });
});
