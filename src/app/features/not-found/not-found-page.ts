import { ChangeDetectionStrategy, Component } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { RouterLink } from '@angular/router';

/** Shown for any address the app does not know. */
@Component({
  selector: 'app-not-found-page',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [RouterLink, MatButtonModule],
  template: `
    <main class="cs-page">
      <h1 class="cs-page-title">Page not found</h1>
      <p class="cs-page-lead">
        There is no page at this address. It may have moved, or the link may be mistyped.
      </p>
      <a mat-flat-button routerLink="/">Go to the start page</a>
    </main>
  `,
})
export class NotFoundPage {}

export default NotFoundPage;
