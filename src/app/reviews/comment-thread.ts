import { DatePipe } from '@angular/common';
import { ChangeDetectionStrategy, Component, computed, inject, input, linkedSignal, output, signal, viewChild } from '@angular/core';
import { takeUntilDestroyed } from '@angular/core/rxjs-interop';
import { FormControl, FormGroup, FormGroupDirective, ReactiveFormsModule, Validators } from '@angular/forms';
import { MatButton } from '@angular/material/button';
import { MatCheckbox } from '@angular/material/checkbox';
import { MatError, MatFormField, MatLabel } from '@angular/material/form-field';
import { MatIcon } from '@angular/material/icon';
import { MatInput } from '@angular/material/input';
import { MatOption, MatSelect } from '@angular/material/select';
import type { CreateComment, ReviewComment } from '@shared/contracts/reviews-api';
import { applyFieldErrors } from '../core/forms/apply-field-errors';
import { problemFrom } from '../core/http/api-problem';
import { anchorText, type CommentAnchor } from './comment-anchors';
import { ReviewsApi } from './reviews-api';

/** One comment as the thread shows it: its depth under the first comment of the thread. */
interface ThreadEntry {
  comment: ReviewComment;
  depth: number;
}

interface Thread {
  root: ReviewComment;
  anchor: string;
  entries: ThreadEntry[];
}

/** Replies deeper than this are drawn at this indent, so long exchanges stay readable. */
const MAX_INDENT = 3;

/**
 * The comments of a review as threads: each anchored to a stage and field or to the design as a
 * whole, with replies under the comment they answer and a resolved state per thread.
 */
@Component({
  selector: 'qb-comment-thread',
  imports: [DatePipe, MatButton, MatCheckbox, MatError, MatFormField, MatIcon, MatInput, MatLabel, MatOption, MatSelect, ReactiveFormsModule],
  templateUrl: './comment-thread.html',
  styleUrl: './comment-thread.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class CommentThread {
  private readonly api = inject(ReviewsApi);
  private readonly formDirective = viewChild(FormGroupDirective);

  readonly reviewId = input.required<string>();
  readonly comments = input.required<readonly ReviewComment[]>();
  readonly anchors = input<readonly CommentAnchor[]>([]);
  /** Emitted when the user picks an anchor to look at it in the snapshot. */
  readonly showAnchor = output<{ stage: string; field: string | null }>();

  protected readonly list = linkedSignal(() => [...this.comments()]);
  protected readonly hideResolved = signal(false);
  protected readonly posting = signal(false);
  protected readonly failure = signal<string | null>(null);
  protected readonly replyingTo = signal<string | null>(null);
  protected readonly maxIndent = MAX_INDENT;

  protected readonly form = new FormGroup({
    stage: new FormControl('', { nonNullable: true }),
    field: new FormControl('', { nonNullable: true }),
    body: new FormControl('', { nonNullable: true, validators: [Validators.required, Validators.maxLength(10000)] }),
  });
  protected readonly reply = new FormControl('', { nonNullable: true, validators: [Validators.required, Validators.maxLength(10000)] });

  private readonly chosenStage = signal('');
  protected readonly fieldOptions = computed(() => this.anchors().find((anchor) => anchor.stage === this.chosenStage())?.fields ?? []);

  protected readonly threads = computed<Thread[]>(() => {
    const comments = this.list();
    const ids = new Set(comments.map((comment) => comment.id));
    const children = new Map<string, ReviewComment[]>();
    for (const comment of comments) {
      if (comment.parentId === null || !ids.has(comment.parentId)) continue;
      children.set(comment.parentId, [...(children.get(comment.parentId) ?? []), comment]);
    }
    const byTime = (a: ReviewComment, b: ReviewComment) => a.createdAt.localeCompare(b.createdAt);
    const descend = (comment: ReviewComment, depth: number): ThreadEntry[] => [
      { comment, depth },
      ...(children.get(comment.id) ?? []).sort(byTime).flatMap((child) => descend(child, depth + 1)),
    ];
    return comments
      .filter((comment) => comment.parentId === null || !ids.has(comment.parentId))
      .sort(byTime)
      .map((root) => ({ root, anchor: anchorText(this.anchors(), root.stage, root.field), entries: descend(root, 0) }));
  });
  protected readonly shownThreads = computed(() => (this.hideResolved() ? this.threads().filter((thread) => !thread.root.resolved) : this.threads()));
  protected readonly openCount = computed(() => this.threads().filter((thread) => !thread.root.resolved).length);

  constructor() {
    this.form.controls.stage.valueChanges.pipe(takeUntilDestroyed()).subscribe((stage) => {
      this.chosenStage.set(stage);
      this.form.controls.field.setValue('');
    });
  }

  /** Starts a comment on this anchor, as when the reviewer picks a field in the snapshot. */
  anchorTo(stage: string, field: string | null): void {
    this.form.controls.stage.setValue(stage);
    this.form.controls.field.setValue(field ?? '');
  }

  protected addComment(): void {
    if (this.form.invalid || this.posting()) {
      this.form.markAllAsTouched();
      return;
    }
    const { stage, field, body } = this.form.getRawValue();
    const comment: CreateComment = { body };
    if (stage !== '') comment.stage = stage;
    if (stage !== '' && field !== '') comment.field = field;
    // Resetting through the directive also clears its submitted state, so the empty field shows no error.
    this.post(comment, () => this.formDirective()?.resetForm({ stage: '', field: '', body: '' }), this.form);
  }

  protected startReply(comment: ReviewComment): void {
    this.reply.reset();
    this.replyingTo.set(comment.id);
  }

  protected cancelReply(): void {
    this.replyingTo.set(null);
  }

  protected sendReply(parent: ReviewComment): void {
    if (this.reply.invalid || this.posting()) {
      this.reply.markAsTouched();
      return;
    }
    const comment: CreateComment = { body: this.reply.value, parentId: parent.id };
    if (parent.stage !== null) comment.stage = parent.stage;
    if (parent.stage !== null && parent.field !== null) comment.field = parent.field;
    this.post(comment, () => this.replyingTo.set(null), null);
  }

  protected setResolved(comment: ReviewComment, resolved: boolean): void {
    this.failure.set(null);
    this.api.setResolved(this.reviewId(), comment.id, resolved).subscribe({
      next: (updated) => this.list.update((list) => list.map((item) => (item.id === updated.id ? updated : item))),
      error: (error: unknown) => this.failure.set(problemFrom(error).detail),
    });
  }

  protected anchorOf(comment: ReviewComment): string {
    return anchorText(this.anchors(), comment.stage, comment.field);
  }

  protected indent(depth: number): number {
    return Math.min(depth, MAX_INDENT) * 24;
  }

  private post(comment: CreateComment, done: () => void, form: FormGroup | null): void {
    this.failure.set(null);
    this.posting.set(true);
    this.api.comment(this.reviewId(), comment).subscribe({
      next: (created) => {
        this.posting.set(false);
        this.list.update((list) => [...list, created]);
        done();
      },
      error: (error: unknown) => {
        this.posting.set(false);
        const problem = problemFrom(error);
        const unmatched = form === null ? [problem.detail] : applyFieldErrors(form, problem.errors);
        this.failure.set(problem.errors.length > 0 && unmatched.length === 0 ? null : problem.detail);
      },
    });
  }
}
