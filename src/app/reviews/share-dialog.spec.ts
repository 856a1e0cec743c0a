import { provideHttpClient } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { TestBed } from '@angular/core/testing';
import { MAT_DIALOG_DATA, MatDialogRef } from '@angular/material/dialog';
import type { Review } from '@shared/contracts/reviews-api';
import { MAIL_WATCH_MS, MAIL_WATCH_TIMES, ShareDialog, type ShareRequest } from './share-dialog';

const designId = '00000000-0000-4000-8000-0000000000d1';
const reviewId = '00000000-0000-4000-8000-0000000000e1';
const person = { id: '00000000-0000-4000-8000-0000000000a1', displayName: 'Demo Designer', email: 'designer@example.com' };
const request: ShareRequest = { designId, designName: 'Line sensor', versionNumber: 3 };

function review(notification: Review['notification'], id = reviewId): Review {
  return {
    id,
    design: { id: designId, name: 'Line sensor' },
    versionNumber: 3,
    requestedBy: person,
    reviewerEmail: 'rita@example.com',
    reviewer: null,
    note: '',
    state: 'pending',
    decisionNote: null,
    decidedAt: null,
    createdAt: '2026-03-01T10:00:00.000Z',
    notification,
  };
}

describe('ShareDialog', () => {
  let http: HttpTestingController;

  beforeEach(() => {
    TestBed.configureTestingModule({
      imports: [ShareDialog],
      providers: [provideHttpClient(), provideHttpClientTesting(), { provide: MAT_DIALOG_DATA, useValue: request }, { provide: MatDialogRef, useValue: { close: () => undefined } }],
    });
    http = TestBed.inject(HttpTestingController);
    jasmine.clock().install();
  });

  afterEach(() => {
    jasmine.clock().uninstall();
    http.verify();
  });

  async function share(fixture: ReturnType<typeof TestBed.createComponent<ShareDialog>>, email: string) {
    const element = fixture.nativeElement as HTMLElement;
    const input = element.querySelector<HTMLInputElement>('[data-testid="reviewer-email"]')!;
    input.value = email;
    input.dispatchEvent(new Event('input'));
    element.querySelector<HTMLButtonElement>('[data-testid="confirm-share"]')!.click();
    await fixture.whenStable();
  }

  it('should share the version with the trimmed address and the note', async () => {
    const fixture = TestBed.createComponent(ShareDialog);
    await fixture.whenStable();
    await share(fixture, '  rita@example.com ');
    const sent = http.expectOne({ method: 'POST', url: `/api/designs/${designId}/versions/3/reviews` });
    expect(sent.request.body).toEqual({ reviewerEmail: 'rita@example.com', note: '' });
    sent.flush(review('sent'));
    await fixture.whenStable();
    const result = (fixture.nativeElement as HTMLElement).querySelector('[data-testid="share-result"]')!;
    expect(result.textContent).toContain('The e-mail has been sent.');
    expect((fixture.nativeElement as HTMLElement).querySelector('[data-testid="mail-watching"]')).toBeNull();
  });

  it('should show a pending e-mail as sent once the outbox has sent it, asking again every few seconds', async () => {
    const fixture = TestBed.createComponent(ShareDialog);
    await fixture.whenStable();
    await share(fixture, 'rita@example.com');
    http.expectOne({ method: 'POST', url: `/api/designs/${designId}/versions/3/reviews` }).flush(review('pending'));
    await fixture.whenStable();
    const element = fixture.nativeElement as HTMLElement;
    expect(element.querySelector('[data-testid="share-result"]')!.textContent).toContain('The e-mail is pending');
    expect(element.querySelector('[data-testid="mail-watching"]')).not.toBeNull();

    jasmine.clock().tick(MAIL_WATCH_MS);
    http.expectOne(`/api/designs/${designId}/reviews`).flush({ items: [review('sent', '00000000-0000-4000-8000-0000000000e9'), review('pending')] });
    await fixture.whenStable();
    expect(element.querySelector('[data-testid="share-result"]')!.textContent).toContain('The e-mail is pending');

    jasmine.clock().tick(MAIL_WATCH_MS);
    http.expectOne(`/api/designs/${designId}/reviews`).flush({ items: [review('sent')] });
    await fixture.whenStable();
    expect(element.querySelector('[data-testid="share-result"]')!.textContent).toContain('The e-mail has been sent.');

    // Sent: no more questions.
    jasmine.clock().tick(5 * MAIL_WATCH_MS);
    http.expectNone(`/api/designs/${designId}/reviews`);
  });

  it('should stop asking after a minute when the mail server stays away', async () => {
    const fixture = TestBed.createComponent(ShareDialog);
    await fixture.whenStable();
    await share(fixture, 'rita@example.com');
    http.expectOne({ method: 'POST', url: `/api/designs/${designId}/versions/3/reviews` }).flush(review('pending'));
    await fixture.whenStable();
    for (let turn = 0; turn < MAIL_WATCH_TIMES; turn += 1) {
      jasmine.clock().tick(MAIL_WATCH_MS);
      http.expectOne(`/api/designs/${designId}/reviews`).flush({ items: [review('pending')] });
    }
    jasmine.clock().tick(10 * MAIL_WATCH_MS);
    http.expectNone(`/api/designs/${designId}/reviews`);
    await fixture.whenStable();
    expect((fixture.nativeElement as HTMLElement).querySelector('[data-testid="share-result"]')!.textContent).toContain('The e-mail is pending');
  });

  it('should show the server’s field error under the address', async () => {
    const fixture = TestBed.createComponent(ShareDialog);
    await fixture.whenStable();
    await share(fixture, 'designer@example.com');
    http
      .expectOne({ method: 'POST', url: `/api/designs/${designId}/versions/3/reviews` })
      .flush(
        { status: 400, title: 'Bad request', detail: 'You cannot review your own design.', errors: [{ path: 'reviewerEmail', message: 'Choose a colleague, not yourself' }] },
        { status: 400, statusText: 'Bad Request' },
      );
    await fixture.whenStable();
    fixture.detectChanges();
    const element = fixture.nativeElement as HTMLElement;
    expect(element.textContent).toContain('Choose a colleague, not yourself');
    expect(element.querySelector('[data-testid="share-failure"]')).toBeNull();
  });
});
