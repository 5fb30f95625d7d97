import { FormControl } from '@angular/forms';
import { randomSeed, runsMessage, runsValidator, seedMessage, seedValidator } from './rehearsal-form-rules';

describe('rehearsal form rules', () => {
  it('bounds the cascades by the server cap', () => {
    const c = new FormControl<number | null>(
      5000,
      runsValidator(() => 20000),
    );
    expect(c.valid).toBeTrue();
    c.setValue(20001);
    expect(runsMessage(c.errors, 20000)).toBe('The server allows at most 20,000 cascades per rehearsal.');
    c.setValue(0);
    expect(runsMessage(c.errors, 20000)).toBe('Simulate at least 1 cascade.');
    c.setValue(10.5);
    expect(runsMessage(c.errors, 20000)).toBe('Cascades are a whole number.');
  });

  it('accepts the seed alphabet and rejects anything else', () => {
    const c = new FormControl('ab-12_Z', seedValidator);
    expect(c.valid).toBeTrue();
    for (const bad of ['with space', 'x'.repeat(65), 'semi;colon', '']) {
      c.setValue(bad);
      expect(seedMessage(c.errors)).withContext(bad).not.toBeNull();
    }
  });

  it('makes random seeds that pass the rule and differ', () => {
    const a = randomSeed();
    const b = randomSeed();
    expect(seedValidator(new FormControl(a))).toBeNull();
    expect(a).not.toBe(b);
  });
});
