import { describe, it, expect } from 'vitest';
import {
  base64Of,
  draftOf,
  draftProblems,
  emptyDraft,
  FIELD_LABELS,
  mappingOf,
  type DraftRow,
  type ProfileDraft,
  type SavedProfile,
} from '../../../src/components/rides/profile-draft';
import { readHeaderCell } from '../../../src/lib/rides/headers';

function keys(): () => string {
  let n = 0;
  return () => `k${++n}`;
}

function draft(rows: Omit<DraftRow, 'key'>[], extra: Partial<ProfileDraft> = {}): ProfileDraft {
  return { name: 'Cycle A', deviceName: '', rows: rows.map((r, i) => ({ key: `r${i}`, ...r })), metresPerRev: '', timeFormat: '', ...extra };
}

const saved: SavedProfile = {
  id: 'p1',
  clinicId: 'c1',
  name: 'Cycle A',
  deviceName: 'Workshop cycle',
  columns: { Secs: { field: 'time' }, 'Out (kW)': { field: 'power', unit: 'kW' }, 'L quad': { field: 'quadriceps_left' } },
  metresPerRev: 2.1,
  timeFormat: 'seconds',
};

describe('emptyDraft', () => {
  it('starts with one blank row and no settings', () => {
    expect(emptyDraft(keys())).toEqual({ name: '', deviceName: '', rows: [{ key: 'k1', header: '', field: '', unit: '' }], metresPerRev: '', timeFormat: '' });
  });
});

describe('draftOf', () => {
  it('turns a saved profile into rows in the order of its columns', () => {
    const d = draftOf(saved, keys());
    expect(d.rows).toEqual([
      { key: 'k1', header: 'Secs', field: 'time', unit: '' },
      { key: 'k2', header: 'Out (kW)', field: 'power', unit: 'kW' },
      { key: 'k3', header: 'L quad', field: 'quadriceps_left', unit: '' },
    ]);
    expect(d).toMatchObject({ name: 'Cycle A', deviceName: 'Workshop cycle', metresPerRev: '2.1', timeFormat: 'seconds' });
  });

  it('gives empty strings for settings the profile leaves unset', () => {
    const d = draftOf({ ...saved, deviceName: null, metresPerRev: null, timeFormat: null }, keys());
    expect(d).toMatchObject({ deviceName: '', metresPerRev: '', timeFormat: '' });
  });

  it('gives one blank row to a profile without columns', () => {
    expect(draftOf({ ...saved, columns: {} }, keys()).rows).toEqual([{ key: 'k1', header: '', field: '', unit: '' }]);
  });

  it('maps back to the saved profile unchanged', () => {
    const d = draftOf(saved, keys());
    expect(mappingOf(d)).toEqual({ columns: saved.columns, metresPerRev: 2.1, timeFormat: 'seconds' });
    expect(draftProblems(d)).toEqual({ rows: {} });
  });
});

describe('mappingOf', () => {
  it('trims headers and units, and omits an empty unit', () => {
    const d = draft([
      { header: '  Watts ', field: 'power', unit: ' kW ' },
      { header: 'Crank', field: 'cadence', unit: '   ' },
    ]);
    expect(mappingOf(d).columns).toEqual({ Watts: { field: 'power', unit: 'kW' }, Crank: { field: 'cadence' } });
  });

  it('leaves out rows that lack a header or a field', () => {
    const d = draft([
      { header: 'Watts', field: '', unit: '' },
      { header: '   ', field: 'power', unit: '' },
      { header: '', field: '', unit: '' },
      { header: 'Secs', field: 'time', unit: '' },
    ]);
    expect(mappingOf(d).columns).toEqual({ Secs: { field: 'time' } });
  });

  it('reads metres per revolution with a decimal comma', () => {
    expect(mappingOf(draft([], { metresPerRev: '2,5' })).metresPerRev).toBe(2.5);
    expect(mappingOf(draft([], { metresPerRev: ' 1.8 ' })).metresPerRev).toBe(1.8);
  });

  it('leaves out metres per revolution when blank or not a number', () => {
    expect(mappingOf(draft([], { metresPerRev: '' }))).not.toHaveProperty('metresPerRev');
    expect(mappingOf(draft([], { metresPerRev: '   ' }))).not.toHaveProperty('metresPerRev');
    expect(mappingOf(draft([], { metresPerRev: 'two' }))).not.toHaveProperty('metresPerRev');
  });

  it('leaves out the time format when it is left to detection', () => {
    expect(mappingOf(draft([]))).toEqual({ columns: {} });
    expect(mappingOf(draft([], { timeFormat: 'clock' })).timeFormat).toBe('clock');
  });
});

describe('draftProblems', () => {
  it('finds nothing wrong with complete rows and blank rows', () => {
    const d = draft([
      { header: 'Secs', field: 'time', unit: '' },
      { header: '', field: '', unit: '' },
    ]);
    expect(draftProblems(d)).toEqual({ rows: {} });
  });

  it('asks for the header of a row that has only a field', () => {
    expect(draftProblems(draft([{ header: '  ', field: 'power', unit: '' }])).rows).toEqual({
      r0: { on: 'header', message: 'Write the header as it appears in the file.', incomplete: true },
    });
  });

  it('asks for the field of a row that has only a header', () => {
    expect(draftProblems(draft([{ header: 'Watts', field: '', unit: '' }])).rows).toEqual({
      r0: { on: 'field', message: 'Choose the Kinloop field for this header.', incomplete: true },
    });
  });

  it('reports a repeated header, ignoring case and outer spaces, with the 1-based column of the first', () => {
    const d = draft([
      { header: '', field: '', unit: '' },
      { header: 'Watts', field: 'power', unit: '' },
      { header: ' WATTS ', field: 'cadence', unit: '' },
    ]);
    expect(draftProblems(d).rows).toEqual({ r2: { on: 'header', message: 'The same header is already mapped in column 2.', incomplete: false } });
  });

  it('accepts metres per revolution from 0.1 to 20, with a decimal point or comma', () => {
    for (const text of ['0.1', '2', '2,0', '20', '']) expect(draftProblems(draft([], { metresPerRev: text }))).not.toHaveProperty('metresPerRev');
  });

  it('refuses metres per revolution outside 0.1 to 20 or not a number', () => {
    for (const text of ['0.09', '20.01', '0', '-2', 'two', '2,5,0']) {
      expect(draftProblems(draft([], { metresPerRev: text })).metresPerRev).toBe('Write a number from 0.1 to 20, such as 2.0.');
    }
  });

  // The ride-file reader matches profile keys with lib/rides/headers.ts
  // headerKey: case-insensitive and ignoring spaces and punctuation. The draft
  // checks repeats only by trimmed lower case, so "Quad L" and "quad_l" pass as
  // two rows although the reader sees one key, applies the first mapping and
  // silently never uses the second. The duplicate check should use the reader's
  // headerKey.
  describe('headers the ride-file reader treats as the same', () => {
    const d = draft([
      { header: 'Quad L', field: 'quadriceps_left', unit: '' },
      { header: 'quad_l', field: 'quadriceps_right', unit: '' },
    ]);

    it('are one key for the reader, which applies only the first mapping', () => {
      const profile = { name: d.name, columns: mappingOf(d).columns };
      expect(readHeaderCell('quad_l', profile).field).toBe('quadriceps_left');
    });

    it('are reported as a repeated header', () => {
      expect(draftProblems(d).rows.r1).toMatchObject({ on: 'header', incomplete: false });
    });
  });
});

describe('FIELD_LABELS', () => {
  it('names channel currents with the side first', () => {
    expect(FIELD_LABELS.quadriceps_left).toBe('Left quadriceps current');
    expect(FIELD_LABELS.channel_8).toBe('Channel 8 current');
    expect(FIELD_LABELS.pulse_width).toBe('Pulse width');
  });
});

describe('base64Of', () => {
  it('matches Node’s own base64 for empty, short and large inputs', () => {
    // source: Node.js Buffer.toString('base64') (RFC 4648 base64)
    for (const length of [0, 1, 2, 3, 0x8000, 0x8000 + 1, 100_000]) {
      const bytes = Uint8Array.from({ length }, (_, i) => (i * 31 + 7) % 256);
      expect(base64Of(bytes)).toBe(Buffer.from(bytes).toString('base64'));
    }
  });

  it('encodes a known string', () => {
    // source: RFC 4648 section 10 test vectors
    expect(base64Of(new TextEncoder().encode('foobar'))).toBe('Zm9vYmFy');
    expect(base64Of(new TextEncoder().encode('fo'))).toBe('Zm8=');
  });
});
