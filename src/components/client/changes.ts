// The client page is several islands; when one changes the program (a new
// prescription version, a pause), the others that show figures derived from
// it load them again.
import { useEffect } from 'react';

const EVENT = 'kinloop:program-changed';

export function announceProgramChange(): void {
  window.dispatchEvent(new Event(EVENT));
}

export function useOnProgramChange(reload: () => void): void {
  useEffect(() => {
    window.addEventListener(EVENT, reload);
    return () => window.removeEventListener(EVENT, reload);
  }, [reload]);
}
