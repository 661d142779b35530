import { fileStem } from './export-files';

describe('export file names', () => {
  it('makes safe file names', () => {
    expect(fileStem('Harmonic trap, N ≤ 8')).toBe('harmonic-trap-n-8');
    expect(fileStem('***')).toBe('traceloom');
  });
});
