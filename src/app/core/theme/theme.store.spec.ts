import { TestBed } from '@angular/core/testing';
import { ThemeStore } from './theme.store';

describe('ThemeStore', () => {
  beforeEach(() => {
    localStorage.clear();
    document.documentElement.classList.remove('cw-dark');
  });

  it('should start light when nothing is stored and the system has no preference', () => {
    const store = TestBed.inject(ThemeStore);
    TestBed.tick();
    expect(store.mode()).toBe('light');
    expect(document.documentElement.classList.contains('cw-dark')).toBe(false);
  });

  it('should switch to dark, mark the document and remember the choice', () => {
    const store = TestBed.inject(ThemeStore);
    store.toggle();
    TestBed.tick();
    expect(document.documentElement.classList.contains('cw-dark')).toBe(true);
    expect(localStorage.getItem('cw.theme')).toBe('dark');
  });

  it('should start with the stored choice', () => {
    localStorage.setItem('cw.theme', 'dark');
    const store = TestBed.inject(ThemeStore);
    expect(store.mode()).toBe('dark');
  });
});
