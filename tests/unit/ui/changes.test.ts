import { describe, it, expect, vi, beforeEach, afterEach } from 'vitest';
import { announceProgramChange, useOnProgramChange } from '../../../src/components/client/changes';

// The hook is only a subscription; running its effect by hand tests that
// without a DOM renderer. vi.mock is hoisted above the imports.
const effects = vi.hoisted(() => ({ runs: [] as { effect: () => void | (() => void); deps: unknown[] | undefined }[] }));
vi.mock('react', () => ({
  useEffect: (effect: () => void | (() => void), deps?: unknown[]) => {
    effects.runs.push({ effect, deps });
  },
}));

describe('program-change announcements', () => {
  beforeEach(() => {
    effects.runs = [];
    vi.stubGlobal('window', new EventTarget());
  });
  afterEach(() => {
    vi.unstubAllGlobals();
  });

  it('reach every island that listens, once per announcement', () => {
    const a = vi.fn();
    const b = vi.fn();
    useOnProgramChange(a);
    useOnProgramChange(b);
    for (const run of effects.runs) run.effect();
    announceProgramChange();
    announceProgramChange();
    expect(a).toHaveBeenCalledTimes(2);
    expect(b).toHaveBeenCalledTimes(2);
  });

  it('stop reaching an island once its effect is cleaned up', () => {
    const reload = vi.fn();
    useOnProgramChange(reload);
    const cleanup = effects.runs[0].effect();
    announceProgramChange();
    expect(typeof cleanup).toBe('function');
    (cleanup as () => void)();
    announceProgramChange();
    expect(reload).toHaveBeenCalledTimes(1);
  });

  it('resubscribe when the reload function changes', () => {
    const reload = vi.fn();
    useOnProgramChange(reload);
    expect(effects.runs[0].deps).toEqual([reload]);
  });

  it('are not heard before the effect runs', () => {
    const reload = vi.fn();
    useOnProgramChange(reload);
    announceProgramChange();
    expect(reload).not.toHaveBeenCalled();
  });

  it('are not plain window events of another name', () => {
    const reload = vi.fn();
    useOnProgramChange(reload);
    effects.runs[0].effect();
    window.dispatchEvent(new Event('change'));
    expect(reload).not.toHaveBeenCalled();
  });
});
