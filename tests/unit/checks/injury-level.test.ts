import { describe, it, expect } from 'vitest';
import { assessAdRisk, parseInjuryLevel } from '../../../src/lib/checks/injury-level';

describe('parseInjuryLevel', () => {
  it('reads levels in any case and with trailing words', () => {
    expect(parseInjuryLevel('C6')?.label).toBe('C6');
    expect(parseInjuryLevel('t10')?.label).toBe('T10');
    expect(parseInjuryLevel('T4 AIS A')?.label).toBe('T4');
    expect(parseInjuryLevel('L1')?.label).toBe('L1');
    expect(parseInjuryLevel('S2')?.label).toBe('S2');
    expect(parseInjuryLevel('T-6')?.label).toBe('T6');
  });

  it('takes the most rostral level when several are written', () => {
    expect(parseInjuryLevel('T7-T4')?.label).toBe('T4');
    expect(parseInjuryLevel('L1 motor, T12 sensory')?.label).toBe('T12');
  });

  // from memory: the cord's neurological levels are C1–C8, T1–T12, L1–L5 and
  // S1–S4/5 (ISNCSCI), so C9, T13 and T0 do not exist; a lower number is more
  // rostral within a region, and the regions run C, T, L, S from the head.
  it('refuses segments that do not exist and text without a level', () => {
    expect(parseInjuryLevel('C9')).toBeNull();
    expect(parseInjuryLevel('T13')).toBeNull();
    expect(parseInjuryLevel('T0')).toBeNull();
    expect(parseInjuryLevel('multiple sclerosis')).toBeNull();
    expect(parseInjuryLevel('AIS C')).toBeNull();
    expect(parseInjuryLevel('')).toBeNull();
    expect(parseInjuryLevel(null)).toBeNull();
  });
});

describe('assessAdRisk', () => {
  // source: Consortium for Spinal Cord Medicine clinical practice guideline on
  // autonomic dysreflexia: the population at risk is injuries at T6 and above.
  it('puts C5 and T6 at risk, T7 and L1 not', () => {
    expect(assessAdRisk('C5', 'unknown').atRisk).toBe(true);
    expect(assessAdRisk('T6', 'unknown').atRisk).toBe(true);
    expect(assessAdRisk('T7', 'unknown').atRisk).toBe(false);
    expect(assessAdRisk('L1', 'unknown').atRisk).toBe(false);
  });

  it('lets a level at or above T6 win over a "not at risk" marking, and says so', () => {
    const r = assessAdRisk('T4', 'not_at_risk');
    expect(r.atRisk).toBe(true);
    expect(r.reason).toContain('T4');
    expect(r.reason).toContain('even though the record says not at risk');
  });

  it('honours an "at risk" marking below T6 or without a level', () => {
    expect(assessAdRisk('T10', 'at_risk').atRisk).toBe(true);
    expect(assessAdRisk(null, 'at_risk').atRisk).toBe(true);
  });

  it('treats an unknown level and marking as not at risk, and says the level could not be read', () => {
    const r = assessAdRisk('incomplete', 'unknown');
    expect(r.atRisk).toBe(false);
    expect(r.reason).toContain('"incomplete" could not be read');
  });
});
