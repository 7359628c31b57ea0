import { DatePipe } from '@angular/common';
import { ChangeDetectionStrategy, Component, computed, input, output, signal } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatIconModule } from '@angular/material/icon';
import { MatListModule } from '@angular/material/list';
import type { CapturedMail as CapturedMailItem } from '@shared/contracts/team';
import { splitLinks } from './link-segments';

/**
 * Mail the development server caught instead of sending (invitations, mostly), so a developer
 * can follow an invitation link without a real mailbox. Bodies are shown as text; only http(s)
 * addresses become links.
 */
@Component({
  selector: 'app-captured-mail',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [DatePipe, MatListModule, MatButtonModule, MatIconModule],
  templateUrl: './captured-mail.html',
  styleUrl: './captured-mail.scss',
})
export class CapturedMail {
  /** The captured messages. */
  readonly mail = input.required<CapturedMailItem[]>();

  /** Emits when the user asks for the list again. */
  readonly refresh = output<void>();

  private readonly selectedId = signal<string | null>(null);

  /** The open message, if it is still in the list. */
  protected readonly selected = computed(
    () => this.mail().find((item) => item.id === this.selectedId()) ?? null,
  );

  /** The open message's body split into text and links. */
  protected readonly bodySegments = computed(() => splitLinks(this.selected()?.text ?? ''));

  /** Opens one message. */
  protected open(item: CapturedMailItem): void {
    this.selectedId.set(item.id);
  }

  /** Closes the open message. */
  protected close(): void {
    this.selectedId.set(null);
  }
}
