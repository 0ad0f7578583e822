import { describe, expect, it } from 'vitest';
import { readFileSync } from 'node:fs';
import { ProjectFileError, parseProject } from '../../src/io/projectFile';

/** docs/project-format.md must describe the format parseProject reads: its example and its sample messages. */
describe('docs/project-format.md', () => {
  const doc = readFileSync('docs/project-format.md', 'utf8');

  it('parseProject(example) reads the example of the format description', () => {
    const example = /```json\n([\s\S]*?)\n```/.exec(doc)![1];
    const project = parseProject(example);
    expect(project.datasets[0].stations).toHaveLength(2);
    expect(project.datasets[0].stations[1].problems[0].expected).toBe('a dip from 0 to 90');
  });

  it('parseProject gives the message the description shows for a file of a newer version', () => {
    const example = /```json\n([\s\S]*?)\n```/.exec(doc)![1];
    try {
      parseProject(example.replace('"version": 1', '"version": 2'));
      expect.fail('accepted');
    } catch (e) {
      expect(e).toBeInstanceOf(ProjectFileError);
      expect(doc).toContain(`\`${(e as Error).message}\``);
    }
  });
});
