import { cautionText } from '@shared/cautions.js';

/** The caution shown once, under computed results (text: shared/cautions.ts). */
export function SafetyNote() {
  return (
    <p className="border-t border-line px-3 py-2 text-caption text-ink-3" data-testid="safety-note">
      {cautionText}
    </p>
  );
}
