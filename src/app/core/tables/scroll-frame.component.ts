import {
  afterNextRender,
  ChangeDetectionStrategy,
  Component,
  DestroyRef,
  ElementRef,
  inject,
  input,
  signal,
  viewChild,
} from '@angular/core';

/**
 * A box that scrolls a wide table sideways and says so: a shadow on the side where more
 * columns are hidden, and a line of text under the box while any are. The table's own
 * sticky first column keeps the row labels in view.
 */
@Component({
  selector: 'cw-scroll-frame',
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    <div class="frame" [class.more-left]="moreLeft()" [class.more-right]="moreRight()">
      <div
        #scroller
        class="scroller"
        role="region"
        tabindex="0"
        [attr.aria-label]="label()"
        [style.max-height]="maxHeight()"
        (scroll)="measure()"
      >
        <ng-content />
      </div>
    </div>
    @if (moreLeft() || moreRight()) {
      <p class="hint" data-scroll-hint aria-hidden="true">
        <span class="arrow">{{ moreLeft() ? '←' : '' }}</span>
        {{ hintText() }}
        <span class="arrow">{{ moreRight() ? '→' : '' }}</span>
      </p>
    }
  `,
  styles: `
    :host {
      display: block;
      min-width: 0;
    }
    .frame {
      position: relative;
      border: 1px solid var(--mat-sys-outline-variant);
      border-radius: 12px;
      overflow: hidden;
    }
    .scroller {
      overflow: auto;
      overscroll-behavior-x: contain;
    }
    /* Shadows over the edges where columns are out of sight. */
    .frame::before,
    .frame::after {
      content: '';
      position: absolute;
      top: 0;
      bottom: 0;
      width: 28px;
      pointer-events: none;
      opacity: 0;
      transition: opacity 150ms;
      z-index: 3;
    }
    .frame::before {
      left: var(--cw-sticky-width, 0px);
      background: linear-gradient(to right, rgb(0 0 0 / 22%), transparent);
    }
    .frame::after {
      right: 0;
      background: linear-gradient(to left, rgb(0 0 0 / 22%), transparent);
    }
    .frame.more-left::before,
    .frame.more-right::after {
      opacity: 1;
    }
    .hint {
      display: flex;
      gap: 6px;
      align-items: center;
      justify-content: flex-end;
      margin: 4px 4px 0;
      font: var(--mat-sys-body-small);
      color: var(--mat-sys-on-surface-variant);
    }
  `,
})
export class ScrollFrameComponent {
  /** Names the scrolling region for screen readers, e.g. "Budget by node". */
  readonly label = input.required<string>();
  /** A height limit (CSS length) for tables with a sticky header row; none by default. */
  readonly maxHeight = input<string | null>(null);

  private readonly scroller = viewChild.required<ElementRef<HTMLElement>>('scroller');
  protected readonly moreLeft = signal(false);
  protected readonly moreRight = signal(false);

  protected hintText(): string {
    return 'More columns: scroll sideways (swipe, or Shift + wheel)';
  }

  constructor() {
    const destroyRef = inject(DestroyRef);
    afterNextRender(() => {
      const element = this.scroller().nativeElement;
      this.measure();
      if (typeof ResizeObserver === 'undefined') return;
      // The table changes width when columns are chosen or values change length.
      const observer = new ResizeObserver(() => this.measure());
      observer.observe(element);
      const table = element.firstElementChild;
      if (table) observer.observe(table);
      destroyRef.onDestroy(() => observer.disconnect());
    });
  }

  protected measure(): void {
    const el = this.scroller().nativeElement;
    const hidden = el.scrollWidth - el.clientWidth;
    // One pixel of slack: fractional widths round differently on each side.
    this.moreLeft.set(hidden > 1 && el.scrollLeft > 1);
    this.moreRight.set(hidden > 1 && el.scrollLeft < hidden - 1);
  }
}
