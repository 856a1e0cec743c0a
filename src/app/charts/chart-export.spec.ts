import { csvCell, safeFileName, standaloneSvg, tableToCsv } from './chart-export';

describe('chart export', () => {
  it('should put a quote before text that a spreadsheet would run as a formula', () => {
    expect(csvCell('=HYPERLINK("x")')).toBe(`"'=HYPERLINK(""x"")"`);
    expect(csvCell('+1')).toBe("'+1");
    expect(csvCell('-stage')).toBe("'-stage");
    expect(csvCell('@sum')).toBe("'@sum");
    expect(csvCell('ca')).toBe('ca');
  });

  it('should write numbers as they are, negative ones included, and leave empty and undefined cells empty', () => {
    expect(csvCell(-2.5e-9)).toBe('-2.5e-9');
    expect(csvCell(Number.NaN)).toBe('');
    expect(csvCell(null)).toBe('');
  });

  it('should quote separators and line breaks and end every line with CRLF', () => {
    expect(tableToCsv({ columns: ['source', 'share'], rows: [['voltage noise, 1/f', 0.5], ['line\nbreak', 0.5]] })).toBe(
      'source,share\r\n"voltage noise, 1/f",0.5\r\n"line\nbreak",0.5\r\n',
    );
  });

  it('should make a file name a file system accepts', () => {
    expect(safeFileName('levels: demo/pressure')).toBe('levels-demo-pressure');
    expect(safeFileName('  ')).toBe('chart');
  });

  it('should write computed styles inline and drop what only the screen needs', () => {
    const svg = document.createElementNS('http://www.w3.org/2000/svg', 'svg');
    svg.setAttribute('width', '200');
    svg.setAttribute('height', '100');
    svg.innerHTML = '<rect class="kept" width="10" height="10" style="fill: rgb(1, 2, 3)"></rect><rect data-export="skip" width="5" height="5"></rect>';
    document.body.appendChild(svg);
    try {
      const text = standaloneSvg(svg);
      const copy = new DOMParser().parseFromString(text, 'image/svg+xml').documentElement;
      expect(copy.getAttribute('xmlns')).toBe('http://www.w3.org/2000/svg');
      expect(copy.getAttribute('viewBox')).toBe('0 0 200 100');
      expect(copy.querySelectorAll('rect').length).toBe(2);
      expect(copy.querySelector('rect.kept')?.getAttribute('style')).toContain('fill:rgb(1, 2, 3)');
    } finally {
      svg.remove();
    }
  });
});
