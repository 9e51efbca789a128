import { describe, expect, it } from 'vitest';
import { escapeHtml } from '../../src/report/html-escape.js';

describe('HTML escaping', () => {
  it('escapes the five characters that could end an element or a quoted attribute', () => {
    expect(escapeHtml(`<a href="x" title='y'>&</a>`)).toBe('&lt;a href=&quot;x&quot; title=&#39;y&#39;&gt;&amp;&lt;/a&gt;');
    expect(escapeHtml('PELVIS 4F')).toBe('PELVIS 4F');
  });
});
