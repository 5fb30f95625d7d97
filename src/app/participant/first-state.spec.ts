import { takeFirstState } from './first-state';

describe('takeFirstState', () => {
  const token = 'a'.repeat(43);
  const state = { me: { id: 7, name: 'Mira Tollan' }, workshopTitle: 'Harbour tour </script>', names: [] };
  let doc: Document;

  function withBlock(text: string): void {
    doc = document.implementation.createHTMLDocument('page');
    const block = doc.createElement('script');
    block.type = 'application/json';
    block.id = 'rh-first-state';
    block.textContent = text;
    doc.body.append(block);
  }

  it('reads the state written for this link, once', () => {
    withBlock(JSON.stringify(state));
    expect(takeFirstState(token, doc, `/p/${token}`)).toEqual(jasmine.objectContaining(state));
    expect(doc.getElementById('rh-first-state')).toBeNull();
    expect(takeFirstState(token, doc, `/p/${token}`)).toBeNull();
  });

  it('ignores a state written for another address, and drops it', () => {
    withBlock(JSON.stringify(state));
    expect(takeFirstState(token, doc, `/p/${'b'.repeat(43)}`)).toBeNull();
    expect(doc.getElementById('rh-first-state')).toBeNull();
  });

  it('ignores a block that is not a survey state', () => {
    withBlock('{"me"');
    expect(takeFirstState(token, doc, `/p/${token}`)).toBeNull();
    withBlock('null');
    expect(takeFirstState(token, doc, `/p/${token}`)).toBeNull();
    withBlock('{"workshopTitle":"x"}');
    expect(takeFirstState(token, doc, `/p/${token}`)).toBeNull();
  });

  it('is null when the page has no block', () => {
    doc = document.implementation.createHTMLDocument('page');
    expect(takeFirstState(token, doc, `/p/${token}`)).toBeNull();
  });
});
