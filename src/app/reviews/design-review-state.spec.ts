import { TestBed } from '@angular/core/testing';
import type { Review } from '@shared/contracts/reviews-api';
import { DesignReviewState, latestReviewByVersion } from './design-review-state';

const designId = '00000000-0000-4000-8000-0000000000d1';
const person = { id: '00000000-0000-4000-8000-0000000000a1', displayName: 'Demo Designer', email: 'designer@example.com' };

function review(versionNumber: number, state: Review['state'], createdAt: string): Review {
  return {
    id: `00000000-0000-4000-8000-${createdAt.replace(/\D/g, '').slice(0, 12)}`,
    design: { id: designId, name: 'Line sensor' },
    versionNumber,
    requestedBy: person,
    reviewerEmail: 'reviewer@example.com',
    reviewer: null,
    note: '',
    state,
    decisionNote: null,
    decidedAt: null,
    createdAt,
    notification: 'sent',
  };
}

describe('DesignReviewState', () => {
  beforeEach(() => {
    TestBed.configureTestingModule({ imports: [DesignReviewState] });
  });

  it('should show the state and version of the design\'s latest review', async () => {
    const fixture = TestBed.createComponent(DesignReviewState);
    fixture.componentRef.setInput('review', { state: 'approved', versionNumber: 2 });
    await fixture.whenStable();
    const element = fixture.nativeElement as HTMLElement;
    expect(element.querySelector('[data-state]')?.getAttribute('data-state')).toBe('approved');
    expect(element.textContent).toContain('v2');
  });

  it('should show nothing when no version was shared', async () => {
    const fixture = TestBed.createComponent(DesignReviewState);
    fixture.componentRef.setInput('review', null);
    await fixture.whenStable();
    expect((fixture.nativeElement as HTMLElement).textContent?.trim()).toBe('');
  });

  it('should keep the newest review of each version', () => {
    const latest = latestReviewByVersion([review(1, 'changes_requested', '2026-03-01T10:00:00.000Z'), review(1, 'pending', '2026-03-03T10:00:00.000Z'), review(2, 'approved', '2026-03-02T10:00:00.000Z')]);
    expect([...latest.entries()].map(([version, r]) => [version, r.state])).toEqual([
      [1, 'pending'],
      [2, 'approved'],
    ]);
  });
});
