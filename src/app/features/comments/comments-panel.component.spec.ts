import { provideHttpClient } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { signal } from '@angular/core';
import { ComponentFixture, TestBed } from '@angular/core/testing';
import type { CommentDto } from '../../../../shared/schema/api';
import { CollabStore } from '../presence/collab.store';
import { CommentsPanelComponent } from './comments-panel.component';

describe('CommentsPanelComponent', () => {
  let fixture: ComponentFixture<CommentsPanelComponent>;
  let http: HttpTestingController;
  let el: HTMLElement;
  const reloadComments = jest.fn(() => Promise.resolve());

  beforeEach(async () => {
    reloadComments.mockClear();
    TestBed.configureTestingModule({
      providers: [
        provideHttpClient(),
        provideHttpClientTesting(),
        { provide: CollabStore, useValue: { comments: signal<CommentDto[]>([]), reloadComments } },
      ],
    });
    http = TestBed.inject(HttpTestingController);
    fixture = TestBed.createComponent(CommentsPanelComponent);
    fixture.componentRef.setInput('chainId', 'c1');
    fixture.componentRef.setInput('stages', []);
    el = fixture.nativeElement;
    await fixture.whenStable();
  });

  afterEach(() => http.verify());

  async function post(text: string, answer: Partial<CommentDto>): Promise<void> {
    const area = el.querySelector<HTMLTextAreaElement>('#cw-new-comment')!;
    area.value = text;
    area.dispatchEvent(new Event('input'));
    await fixture.whenStable();
    el.querySelector<HTMLButtonElement>('button[type="submit"]')!.click();
    const req = http.expectOne({ method: 'POST', url: '/api/chains/c1/comments' });
    expect(req.request.body).toEqual({ body: text });
    req.flush({
      id: 'k1',
      chainId: 'c1',
      stageId: null,
      body: text,
      authorId: 'u1',
      author: 'Ada',
      createdAt: '2026-01-01T10:00:00.000Z',
      editedAt: null,
      ...answer,
    });
    await fixture.whenStable();
    await new Promise((r) => setTimeout(r, 0));
    await fixture.whenStable();
  }

  it('should say who was told by mail after a post with a mention', async () => {
    await post('Ask ben@lab.test', { notified: ['ben@lab.test'] });
    expect(el.querySelector('[data-testid="comment-told"]')?.textContent).toContain(
      'Mentioned by mail: ben@lab.test.',
    );
    expect(el.querySelector('[role="alert"]')).toBeNull();
    expect(reloadComments).toHaveBeenCalled();
  });

  it('should show a mention mail that could not be sent, keeping the comment posted', async () => {
    const problem =
      'the mail to ben@lab.test could not be sent yet (relay refused); it is kept and retried automatically';
    await post('Ask ben@lab.test', { notified: ['ben@lab.test'], mailProblems: [problem] });
    const alerts = [...el.querySelectorAll('[role="alert"]')].map((a) => a.textContent?.trim());
    expect(alerts).toEqual([problem]);
    // Posted: the box is empty again for the next comment.
    expect(el.querySelector<HTMLTextAreaElement>('#cw-new-comment')!.value).toBe('');
  });
});
