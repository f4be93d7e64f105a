import { describe, expect, it } from 'vitest';
import {
  DEFAULT_NOTICE_SUBJECT,
  DEFAULT_NOTICE_TEMPLATE,
  formatDuration,
  formatRelease,
  formatSiteTime,
  renderTemplate,
  templateProblems,
  type TemplateValues,
} from './template.js';

const values: TemplateValues = {
  organisation: 'Hessford Emergency Management',
  person: 'Dorran Pike',
  zone: 'Hessford',
  distance: '14 km',
  release: '850 m3/s (30,017 cfs)',
  start: 'Tue 1 Dec 2026, 14:05 GMT',
  arrival: 'Tue 1 Dec 2026, 16:05 GMT',
  duration: '6 h',
  dam: 'Orrin Gap Dam',
  river: 'Tamsel River',
};

describe('notice templates', () => {
  it('fills every placeholder of the defaults', () => {
    const text = renderTemplate(DEFAULT_NOTICE_TEMPLATE, values);
    expect(text).toContain('To Dorran Pike, Hessford Emergency Management:');
    expect(text).toContain('about 850 m3/s (30,017 cfs), starting Tue 1 Dec 2026, 14:05 GMT');
    expect(text).not.toMatch(/\{\{|\}\}/);
    expect(renderTemplate(DEFAULT_NOTICE_SUBJECT, values)).toMatch(
      /^Release notice: Orrin Gap Dam/,
    );
  });

  it('catches a misspelt placeholder and a lone brace before anything is sent', () => {
    expect(templateProblems('Arrives {{arival}}')[0]).toMatch(
      /^unknown placeholder \{\{arival\}\}/,
    );
    expect(templateProblems('Arrives {{arrival}')).toEqual([
      'a "{{" or "}}" without its other half',
    ]);
    expect(() => renderTemplate('{{nope}}', values)).toThrow(/template: unknown placeholder/);
    expect(templateProblems(' {{ zone }} ')).toEqual([]);
  });

  it('formats durations, releases and site times as people read them', () => {
    expect(formatDuration(45 * 60)).toBe('45 min');
    expect(formatDuration(90 * 60)).toBe('1 h 30 min');
    expect(formatDuration(2 * 86400 + 3 * 3600)).toBe('2 d 3 h');
    expect(formatRelease(850)).toBe('850 m3/s (30,017 cfs)');
    expect(formatSiteTime(Date.parse('2026-12-01T14:05:00Z'), 'Europe/London')).toBe(
      'Tue 1 Dec 2026, 14:05 GMT',
    );
    expect(formatSiteTime(Date.parse('2026-07-01T14:05:00Z'), 'Europe/London')).toBe(
      'Wed 1 Jul 2026, 15:05 BST',
    );
  });
});
