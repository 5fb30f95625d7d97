import { FormControl } from '@angular/forms';
import { randomSeed, runsMessage, runsValidator, seedMessage, seedValidator } from './rehearsal-form-rules';

describe('rehearsal form rules', () => {
  it('bounds the cascades by the server cap, and the message always matches the current value', () => {
    const c = new FormControl<number | null>(
      5000,
      runsValidator(() => 20000),
    );
    expect(c.valid).toBeTrue();
    c.setValue(0);
    expect(runsMessage(c.errors)).toBe('Simulate at least 1 cascade (at most 20,000).');
    c.setValue(200000);
    expect(runsMessage(c.errors)).toBe('At most 20,000 cascades per rehearsal (you asked for 200,000): lower the number.');
    c.setValue(10.5);
    expect(runsMessage(c.errors)).toBe('Cascades are a whole number: 1 to 20,000.');
    c.setValue(null);
    expect(runsMessage(c.errors)).toBe('Enter how many cascades to simulate.');
    c.setValue(200);
    expect(runsMessage(c.errors)).toBeNull();
  });

  it('accepts the seed alphabet and rejects anything else', () => {
    const c = new FormControl('ab-12_Z', seedValidator);
    expect(c.valid).toBeTrue();
    for (const bad of ['with space', 'x'.repeat(65), 'semi;colon', '']) {
      c.setValue(bad);
      expect(seedMessage(c.errors)).withContext(bad).not.toBeNull();
    }
    c.setValue('fixed');
    expect(seedMessage(c.errors)).toBeNull();
  });

  it('makes random seeds that pass the rule and differ', () => {
    const a = randomSeed();
    const b = randomSeed();
    expect(seedValidator(new FormControl(a))).toBeNull();
    expect(a).not.toBe(b);
  });
});
