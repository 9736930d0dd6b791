import { describe, expect, test } from 'vitest';
import { groupMatchedSets, mapMatchedSetsOutcomes } from '../../src/core/matchedSetsGrouping';

describe('grouping rows into sets', () => {
  const rows = {
    setIds: ['b', 'a', 'a', 'b', 'a', 'c', 'c', 'd', 'd', 'e', 'e', 'e', 'f', 2, '2'],
    treated: [0, 1, 0, 1, 0, 1, 0, 1, 0, 1, 1, 0, 1, 1, 0],
    outcomes: [5, 3, 2, 4, 1, null, 7, 8, NaN, 1, 2, 3, 9, 6, 5],
  };
  const g = groupMatchedSets(rows);

  test('sets are sorted by id, the treated unit first and the controls ascending', () => {
    expect(g.layout.ids).toEqual(['2', 'a', 'b']);
    expect(Array.from(g.layout.start)).toEqual([0, 2, 5, 7]);
    expect(Array.from(g.layout.values)).toEqual([6, 5, 3, 1, 2, 4, 5]);
  });

  test('numbers and text naming the same id are one set', () => {
    expect(g.layout.ids).toContain('2');
    expect(g.setsGiven).toBe(7);
  });

  test('missing outcomes are counted; sets that lose their treated unit or every control are named', () => {
    expect(g.missingOutcomes).toBe(2);
    expect(g.droppedMissingTreatedOutcome).toEqual(['c']);
    expect(g.droppedMissingControlOutcomes).toEqual(['d']);
  });

  test('several treated, no control and no treated are named, not grouped', () => {
    expect(g.setsWithSeveralTreated).toEqual(['e']);
    expect(g.setsWithoutControl).toEqual(['f']);
    const h = groupMatchedSets({ setIds: ['x', 'x'], treated: [0, 0], outcomes: [1, 2] });
    expect(h.setsWithoutTreated).toEqual(['x']);
    expect(h.layout.sets).toBe(0);
  });

  test('bad rows are named by index: no set id, treated not 0/1, outcome not a finite number', () => {
    const h = groupMatchedSets({
      setIds: ['a', null as never, '  ', 'a', 'a', 'a'],
      treated: [1, 0, 0, 0.5, 0, 0],
      outcomes: [1, 2, 3, 4, Infinity, 'x' as never],
    });
    expect(h.rowsWithoutSetId).toEqual([1, 2]);
    expect(h.rowsWithBadTreated).toEqual([3]);
    expect(h.rowsWithBadOutcome).toEqual([4, 5]);
    // the bad-outcome rows still count as controls of set a (it has a control, without a usable outcome)
    expect(h.setsWithoutControl).toEqual([]);
    expect(h.droppedMissingControlOutcomes).toEqual(['a']);
  });

  test('mapping outcomes keeps the layout and leaves the original unchanged', () => {
    const negated = mapMatchedSetsOutcomes(g.layout, (y) => -y);
    expect(Array.from(negated.values)).toEqual([-6, -5, -3, -1, -2, -4, -5]);
    expect(Array.from(g.layout.values)).toEqual([6, 5, 3, 1, 2, 4, 5]);
    expect(negated.start).toBe(g.layout.start);
  });

  test('the result is frozen', () => {
    expect(Object.isFrozen(g)).toBe(true);
    expect(Object.isFrozen(g.layout)).toBe(true);
  });
});
