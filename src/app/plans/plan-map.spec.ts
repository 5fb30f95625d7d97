import { TestBed } from '@angular/core/testing';
import type { PersonDto, TieDto } from '../../../shared/api/rooms';
import { PlanMap } from './plan-map';

const person = (id: number, name: string, group: string | null, x: number | null): PersonDto => ({
  id,
  key: `p${id}`,
  name,
  group,
  email: null,
  x,
  y: x === null ? null : 50,
  pinned: false,
});

describe('PlanMap', () => {
  function render(people: PersonDto[], ties: TieDto[], starters: number[], hops: Map<number, number>): SVGSVGElement {
    const fixture = TestBed.createComponent(PlanMap);
    fixture.componentRef.setInput('people', people);
    fixture.componentRef.setInput('ties', ties);
    fixture.componentRef.setInput('starters', starters);
    fixture.componentRef.setInput('hops', hops);
    fixture.detectChanges();
    return (fixture.nativeElement as HTMLElement).querySelector('svg')!;
  }

  it('draws every tie and person, numbers the starters in briefing order and names a small room', () => {
    // One person without a stored place: the drawing still includes them.
    const people = [person(1, 'Ada Quill', 'Sales', 10), person(2, 'Ben Oster', 'Sales', 200), person(3, 'Cleo Mark', null, null)];
    const ties: TieDto[] = [
      { id: 1, sourceId: 1, targetId: 2, strength: 1 },
      { id: 2, sourceId: 2, targetId: 3, strength: 2 },
    ];
    const svg = render(people, ties, [2, 1], new Map([[3, 1.5]]));
    expect(svg.querySelectorAll('line').length).toBe(2);
    expect(svg.querySelectorAll('g.person').length).toBe(3);
    const orders = [...svg.querySelectorAll('g.starter text.order')].map((t) => t.textContent);
    expect(orders.sort()).toEqual(['1', '2']);
    expect([...svg.querySelectorAll('title')].map((t) => t.textContent)).toContain('Cleo Mark: 1.5 expected hops');
    expect([...svg.querySelectorAll('text.name')].map((t) => t.textContent).sort()).toEqual(['Ada', 'Ben', 'Cleo']);
    for (const g of svg.querySelectorAll('g.person')) expect(g.getAttribute('transform')).not.toContain('NaN');
  });

  it('leaves names out above 40 people (the titles still name everyone)', () => {
    const people = Array.from({ length: 41 }, (_, i) => person(i + 1, `Person ${i + 1}`, null, i * 10));
    const svg = render(people, [], [1], new Map());
    expect(svg.querySelectorAll('text.name').length).toBe(0);
    expect(svg.querySelectorAll('title').length).toBe(41);
  });
});
