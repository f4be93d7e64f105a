import { describe, expect, it } from 'vitest';
import { parseContactsCsv } from './contacts-csv.js';

const HEADER =
  'zone,organisation,person,role,email,phone,lead_time_min,escalation_order,ack_window_min,username';

describe('contacts CSV', () => {
  it('reads good rows, minutes into seconds, optional columns defaulted', () => {
    const csv = [
      HEADER,
      'Hessford,Hessford Emergency Management,Dorran Pike,duty officer,duty@hessford.example,+44 1632 960 301,120,1,20,stakeholder',
      '# a comment line is skipped',
      '"Arnsey Mill","Parish Council, Arnsey",Wenna Trask,clerk,clerk@arnsey.example,01632 960201,90,1,,',
    ].join('\n');
    const { rows, problems } = parseContactsCsv(csv);
    expect(problems).toEqual([]);
    expect(rows.map((r) => r.row)).toEqual([2, 4]);
    expect(rows[0]!.contact).toMatchObject({
      zoneName: 'Hessford',
      leadTimeS: 7200,
      ackWindowS: 1200,
      username: 'stakeholder',
      active: true,
    });
    expect(rows[1]!.contact).toMatchObject({
      organisation: 'Parish Council, Arnsey',
      ackWindowS: 1800,
      username: null,
    });
  });

  it('names the row and the column of every problem', () => {
    const csv = [
      HEADER,
      'Hessford,HEM,Dorran Pike,duty officer,duty@hessford.example,+44 1632 960 301,120,1,20,',
      'Hessford,HEM,,duty officer,duty@hessford.example,+44 1632 960 301,120,1,20,',
      '',
      'Hessford,HEM,Alys Fenwick,clerk,not-an-address,call me,two hours,0,20,',
      'Hessford,HEM,Dorran Again,duty officer,DUTY@hessford.example,+44 1632 960 301,120,1,20,',
    ].join('\n');
    const { rows, problems } = parseContactsCsv(csv);
    expect(rows).toHaveLength(1);
    const messages = problems.map((p) => p.message);
    expect(messages).toContain("row 3, column 'person': required");
    expect(messages).toContain(`row 5, column 'email': not an e-mail address ("not-an-address")`);
    expect(messages).toContain(`row 5, column 'phone': not a phone number ("call me")`);
    expect(messages).toContain(`row 5, column 'lead_time_min': not a whole number ("two hours")`);
    expect(messages.some((m) => m.startsWith("row 5, column 'escalation_order':"))).toBe(true);
    expect(messages).toContain("row 6, column 'email': the same zone and e-mail as row 2");
    expect(problems.find((p) => p.row === 5 && p.column === 'email')).toBeDefined();
  });

  it('refuses a header with a missing or unknown column', () => {
    const { problems } = parseContactsCsv('zone,organisation,person,mail\nx,y,z,w');
    const messages = problems.map((p) => p.message);
    expect(messages).toContain(
      "row 1, column 'mail': unknown column (columns: zone, organisation, person, role, email, phone, lead_time_min, escalation_order, ack_window_min, username, active)",
    );
    expect(messages).toContain("row 1, column 'email': missing from the header");
  });

  it('says so when the file is empty or has only a header', () => {
    expect(parseContactsCsv('').problems[0]?.message).toMatch(/^row 1: the file is empty/);
    expect(parseContactsCsv(HEADER).problems[0]?.message).toBe(
      'row 1: no contacts after the header',
    );
  });
});
