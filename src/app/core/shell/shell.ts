import { HttpErrorResponse } from '@angular/common/http';
import { ChangeDetectionStrategy, Component, inject } from '@angular/core';
import { MatButton } from '@angular/material/button';
import { MatDialog } from '@angular/material/dialog';
import { MatDivider } from '@angular/material/divider';
import { MatIcon } from '@angular/material/icon';
import { MatMenu, MatMenuItem, MatMenuTrigger } from '@angular/material/menu';
import { MatSnackBar } from '@angular/material/snack-bar';
import { MatToolbar } from '@angular/material/toolbar';
import { MatTooltip } from '@angular/material/tooltip';
import { Router, RouterLink, RouterLinkActive, RouterOutlet } from '@angular/router';
import { finalize } from 'rxjs';
import { AuthService } from '../auth/auth-service';

/** The frame around every page but sign-in: toolbar, navigation, user menu. */
@Component({
  selector: 'qb-shell',
  imports: [
    MatButton,
    MatDivider,
    MatIcon,
    MatMenu,
    MatMenuItem,
    MatMenuTrigger,
    MatToolbar,
    MatTooltip,
    RouterLink,
    RouterLinkActive,
    RouterOutlet,
  ],
  templateUrl: './shell.html',
  styleUrl: './shell.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class Shell {
  private readonly auth = inject(AuthService);
  private readonly router = inject(Router);
  private readonly dialog = inject(MatDialog);
  private readonly snackBar = inject(MatSnackBar);

  protected readonly user = this.auth.currentUser;
  protected readonly isAdmin = this.auth.isAdmin;

  protected signOut(): void {
    this.auth
      .signOut()
      .pipe(finalize(() => void this.router.navigateByUrl('/sign-in')))
      .subscribe({
        error: (error: unknown) => {
          // 401: the session had already ended, which is what signing out asks for.
          if (error instanceof HttpErrorResponse && error.status === 401) return;
          this.snackBar.open('Signed out in this browser; the server did not confirm.', 'Close', { duration: 6000 });
        },
      });
  }

  protected async changePassword(): Promise<void> {
    // Loaded on demand: most sessions never open it, so its forms code stays out of the first download.
    const { ChangePasswordDialog } = await import('../../password/change-password-dialog');
    const changed = this.dialog.open(ChangePasswordDialog, { width: '440px', autoFocus: 'first-tabbable' });
    changed.afterClosed().subscribe((done: boolean | undefined) => {
      if (done) this.snackBar.open('Password changed.', 'Close', { duration: 4000 });
    });
  }
}
