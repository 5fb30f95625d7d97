import { emailProblem, keyProblem, personNameProblem, settingProblem, strengthProblem } from './validation';

describe('editor validation', () => {
  it('person names are required and limited', () => {
    expect(personNameProblem('  ')).toBe('A name is needed.');
    expect(personNameProblem('x'.repeat(121))).toMatch(/At most 120/);
    expect(personNameProblem('Ana')).toBeNull();
  });

  it('strength must be a positive, not enormous number', () => {
    expect(strengthProblem('')).toMatch(/Give a number/);
    expect(strengthProblem('abc')).toMatch(/Give a number/);
    // The server's words for the same value (tests/server/rooms-edits.test.ts checks them there).
    expect(strengthProblem(0)).toBe('A tie needs a strength above 0 (delete the tie if there is none).');
    expect(strengthProblem(-2)).toMatch(/above 0/);
    expect(strengthProblem(1e9)).toMatch(/At most/);
    expect(strengthProblem('2,5')).toBeNull();
    expect(strengthProblem(3)).toBeNull();
  });

  it('e-mail is optional but must look like one', () => {
    expect(emailProblem('')).toBeNull();
    expect(emailProblem('ana@example.org')).toBeNull();
    expect(emailProblem('ana@')).toBe('This does not look like an e-mail address (name@example.org); leave it empty if there is none.');
    expect(emailProblem(' Ana@Example.org ')).toBeNull();
  });

  it('keys are unique and settings stay in range', () => {
    expect(keyProblem('P1', (k) => k === 'P1')).toMatch(/already/);
    expect(keyProblem('P2', (k) => k === 'P1')).toBeNull();
    expect(settingProblem('mixing', 0.9)).toBe('From 0 to 0.5.');
    expect(settingProblem('minutesPerHop', '')).toBe('Give a number.');
    expect(settingProblem('laziness', 0.2)).toBeNull();
  });
});
