import { describe, expect, it } from 'vitest';
import { csvLine } from '../../../server/features/scoreboard/open-data';

// Names in the open data come from riders' catalogue proposals. A cell that starts
// with = + - @ (or a tab or carriage return) is run as a formula by spreadsheets,
// so such text gets a leading apostrophe (OWASP, "CSV Injection").
describe('a CSV line of the open data', () => {
  it('when a name starts like a spreadsheet formula, then the cell is kept as text', () => {
    const line = csvLine(['=HYPERLINK("http://example.test","x")', '+1+cmd', '-2+3', '@SUM(A1)', '\tTab']);

    expect(line).toBe(`"'=HYPERLINK(""http://example.test"",""x"")",'+1+cmd,'-2+3,'@SUM(A1),'\tTab\r\n`);
  });

  it('when a value is a negative number, as a number or as the database text of one, then it stays a number', () => {
    const line = csvLine([-1.25, '-0.75', '-3', '1e-3', 'Orbit 2']);

    expect(line).toBe('-1.25,-0.75,-3,1e-3,Orbit 2\r\n');
  });
});
