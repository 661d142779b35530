import { groupTruncations, truncationText } from './truncations';

describe('truncation cautions', () => {
  it('says a repeated cut once, with how often and the range of terms', () => {
    const cut = (terms: number) => ({ field: 'weights', what: 'spectrum lattice points', terms });
    const groups = groupTruncations([
      cut(15),
      cut(16),
      { field: 'grand', what: 'sum', terms: 9 },
      cut(15),
    ]);
    expect(groups.map(truncationText)).toEqual([
      'weights: spectrum lattice points cut off at the order 3 times (after 15–16 terms each; a sector sum cuts once per sector).',
      'grand: sum cut off after 9 terms at the order.',
    ]);
  });
});
