import { provideHttpClient } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { ComponentFixture, TestBed } from '@angular/core/testing';
import { TestbedHarnessEnvironment } from '@angular/cdk/testing/testbed';
import { HarnessLoader } from '@angular/cdk/testing';
import { MatSelectHarness } from '@angular/material/select/testing';
import type { ReviewComment } from '@shared/contracts/reviews-api';
import type { CommentAnchor } from './comment-anchors';
import { CommentThread } from './comment-thread';

const reviewId = '00000000-0000-4000-8000-000000000001';
const designer = { id: '00000000-0000-4000-8000-00000000000a', displayName: 'Demo Designer', email: 'designer@example.com' };
const reviewer = { id: '00000000-0000-4000-8000-00000000000b', displayName: 'Demo Reviewer', email: 'reviewer@example.com' };

function comment(n: number, change: Partial<ReviewComment>): ReviewComment {
  return {
    id: `00000000-0000-4000-8000-1000000000${String(n).padStart(2, '0')}`,
    reviewId,
    author: reviewer,
    parentId: null,
    stage: null,
    field: null,
    body: `comment ${n}`,
    resolved: false,
    createdAt: `2026-03-01T10:0${n}:00.000Z`,
    ...change,
  };
}

const anchors: CommentAnchor[] = [
  { stage: 'ca', label: 'ca · Charge amplifier', fields: [{ key: 'feedbackCapacitance', label: 'Feedback capacitance' }] },
  { stage: 'lp', label: 'lp · Low-pass', fields: [{ key: 'corner', label: 'Corner frequency' }, { key: 'order', label: 'Order' }] },
];

describe('CommentThread', () => {
  let fixture: ComponentFixture<CommentThread>;
  let http: HttpTestingController;
  let loader: HarnessLoader;
  let element: HTMLElement;

  beforeEach(async () => {
    TestBed.configureTestingModule({
      imports: [CommentThread],
      providers: [provideHttpClient(), provideHttpClientTesting()],
    });
    http = TestBed.inject(HttpTestingController);
    fixture = TestBed.createComponent(CommentThread);
    loader = TestbedHarnessEnvironment.loader(fixture);
    element = fixture.nativeElement as HTMLElement;
    fixture.componentRef.setInput('reviewId', reviewId);
    fixture.componentRef.setInput('anchors', anchors);
  });

  afterEach(() => http.verify());

  async function show(comments: ReviewComment[]): Promise<void> {
    fixture.componentRef.setInput('comments', comments);
    await fixture.whenStable();
  }

  function threadTexts(): string[][] {
    return [...element.querySelectorAll('[data-thread]')].map((thread) =>
      [...thread.querySelectorAll('[data-comment] .body')].map((body) => body.textContent?.trim() ?? ''),
    );
  }

  it('should put replies under the comment they answer, in time order, and anchors in words', async () => {
    const root = comment(1, { stage: 'lp', field: 'corner' });
    const reply = comment(3, { parentId: root.id, author: designer, body: 'reply' });
    const replyToReply = comment(4, { parentId: reply.id, body: 'reply to reply' });
    await show([replyToReply, comment(2, {}), root, reply]);
    expect(threadTexts()).toEqual([['comment 1', 'reply', 'reply to reply'], ['comment 2']]);
    const anchorsShown = [...element.querySelectorAll('[data-testid="comment-anchor"]')].map((a) => a.textContent?.replace('location_on', '').replace('description', '').trim());
    expect(anchorsShown).toEqual(['lp · Corner frequency', 'Design as a whole']);
    const indents = [...element.querySelectorAll('[data-thread]')][0]!.querySelectorAll<HTMLElement>('[data-comment]');
    expect([...indents].map((c) => c.style.marginLeft)).toEqual(['0px', '24px', '48px']);
  });

  it('should post a comment anchored to the stage and field picked', async () => {
    await show([]);
    const [stage, field] = await loader.getAllHarnesses(MatSelectHarness);
    await stage!.open();
    await stage!.clickOptions({ text: 'lp · Low-pass' });
    await field!.open();
    await field!.clickOptions({ text: 'Corner frequency' });
    const body = element.querySelector<HTMLTextAreaElement>('[data-testid="comment-body"]')!;
    body.value = 'Corner too close to the ripple limit';
    body.dispatchEvent(new Event('input'));
    element.querySelector<HTMLButtonElement>('[data-testid="add-comment"]')!.click();
    const request = http.expectOne(`/api/reviews/${reviewId}/comments`);
    expect(request.request.method).toBe('POST');
    expect(request.request.body).toEqual({ body: 'Corner too close to the ripple limit', stage: 'lp', field: 'corner' });
    request.flush(comment(5, { stage: 'lp', field: 'corner', body: 'Corner too close to the ripple limit' }));
    await fixture.whenStable();
    expect(threadTexts()).toEqual([['Corner too close to the ripple limit']]);
    expect(body.value).toBe('');
  });

  it('should post a comment on the design as a whole without stage or field', async () => {
    await show([]);
    const body = element.querySelector<HTMLTextAreaElement>('[data-testid="comment-body"]')!;
    body.value = 'Looks sound overall';
    body.dispatchEvent(new Event('input'));
    element.querySelector<HTMLButtonElement>('[data-testid="add-comment"]')!.click();
    const request = http.expectOne(`/api/reviews/${reviewId}/comments`);
    expect(request.request.body).toEqual({ body: 'Looks sound overall' });
    request.flush(comment(6, { body: 'Looks sound overall' }));
    await fixture.whenStable();
  });

  it('should not post an empty comment', async () => {
    await show([]);
    element.querySelector<HTMLButtonElement>('[data-testid="add-comment"]')!.click();
    await fixture.whenStable();
    http.expectNone(`/api/reviews/${reviewId}/comments`);
    expect(element.textContent).toContain('Write the comment first.');
  });

  it('should send a reply with the parent id and the parent anchor', async () => {
    const root = comment(1, { stage: 'ca', field: 'feedbackCapacitance' });
    await show([root]);
    element.querySelector<HTMLButtonElement>('[data-testid="reply"]')!.click();
    await fixture.whenStable();
    const reply = element.querySelector<HTMLTextAreaElement>('[data-testid="reply-body"]')!;
    reply.value = 'Changed to 2.2 pF';
    reply.dispatchEvent(new Event('input'));
    element.querySelector<HTMLButtonElement>('[data-testid="send-reply"]')!.click();
    const request = http.expectOne(`/api/reviews/${reviewId}/comments`);
    expect(request.request.body).toEqual({ body: 'Changed to 2.2 pF', parentId: root.id, stage: 'ca', field: 'feedbackCapacitance' });
    request.flush(comment(2, { parentId: root.id, stage: 'ca', field: 'feedbackCapacitance', body: 'Changed to 2.2 pF', author: designer }));
    await fixture.whenStable();
    expect(threadTexts()).toEqual([['comment 1', 'Changed to 2.2 pF']]);
    expect(element.querySelector('[data-testid="reply-body"]')).toBeNull();
  });

  it('should resolve a thread, then hide it when resolved threads are hidden, and reopen it', async () => {
    const root = comment(1, {});
    await show([root, comment(2, {})]);
    element.querySelector<HTMLButtonElement>(`[data-thread="${root.id}"] [data-testid="resolve"]`)!.click();
    const request = http.expectOne(`/api/reviews/${reviewId}/comments/${root.id}`);
    expect(request.request.method).toBe('PATCH');
    expect(request.request.body).toEqual({ resolved: true });
    request.flush({ ...root, resolved: true });
    await fixture.whenStable();
    expect(element.querySelector(`[data-thread="${root.id}"]`)?.classList).toContain('resolved');
    expect(element.textContent).toContain('1 open of 2');

    element.querySelector<HTMLInputElement>('mat-checkbox input')!.click();
    await fixture.whenStable();
    expect(threadTexts()).toEqual([['comment 2']]);

    element.querySelector<HTMLInputElement>('mat-checkbox input')!.click();
    await fixture.whenStable();
    element.querySelector<HTMLButtonElement>(`[data-thread="${root.id}"] [data-testid="reopen"]`)!.click();
    const reopen = http.expectOne(`/api/reviews/${reviewId}/comments/${root.id}`);
    expect(reopen.request.body).toEqual({ resolved: false });
    reopen.flush(root);
    await fixture.whenStable();
    expect(element.textContent).toContain('2 open of 2');
  });

  it('should show the API message in place when a post fails', async () => {
    await show([]);
    const body = element.querySelector<HTMLTextAreaElement>('[data-testid="comment-body"]')!;
    body.value = 'x';
    body.dispatchEvent(new Event('input'));
    element.querySelector<HTMLButtonElement>('[data-testid="add-comment"]')!.click();
    http
      .expectOne(`/api/reviews/${reviewId}/comments`)
      .flush({ status: 400, title: 'Bad request', detail: 'Comment is not valid.', errors: [{ path: 'body', message: 'Comment must be at most 10000 characters' }] }, { status: 400, statusText: 'Bad Request' });
    await fixture.whenStable();
    expect(element.querySelector('mat-error')?.textContent).toContain('Comment must be at most 10000 characters');
  });
});
