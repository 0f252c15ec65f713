import { relsPathOf, sheetPartPath, withDrawingContentTypes, withDrawingElement, withDrawingRelationship } from './drawing-parts';

// Element order of a worksheet: ECMA-376 Part 1, §18.3.1.99 (CT_Worksheet) — <drawing> after
// <pageSetup>/<headerFooter>/<rowBreaks> and before <legacyDrawing>, <tableParts> and <extLst>.
describe('drawing parts', () => {
  const sheet = '<worksheet xmlns="main" xmlns:r="rel"><sheetData/><pageMargins/><pageSetup/></worksheet>';

  it('puts <drawing> before </worksheet>, or before the parts that must follow it', () => {
    expect(withDrawingElement(sheet, 'rId3')).toBe('<worksheet xmlns="main" xmlns:r="rel"><sheetData/><pageMargins/><pageSetup/><drawing r:id="rId3"/></worksheet>');
    expect(withDrawingElement('<worksheet xmlns:r="rel"><sheetData/><tableParts count="0"/><extLst/></worksheet>', 'rId1')).toBe('<worksheet xmlns:r="rel"><sheetData/><drawing r:id="rId1"/><tableParts count="0"/><extLst/></worksheet>');
    expect(withDrawingElement('<worksheet xmlns="main"><sheetData/></worksheet>', 'rId1')).toMatch(/^<worksheet xmlns:r="http:\/\/schemas\.openxmlformats\.org\/officeDocument\/2006\/relationships" xmlns="main">/);
    expect(() => withDrawingElement('<worksheet><drawing r:id="x"/></worksheet>', 'rId1')).toThrow();
  });

  it('adds a relationship with a fresh id, also to a sheet without rels', () => {
    const created = withDrawingRelationship(null, '../drawings/drawing1.xml');
    expect(created.id).toBe('rId1');
    expect(created.xml).toMatch(/<Relationship Id="rId1" Type="[^"]+\/drawing" Target="\.\.\/drawings\/drawing1\.xml"\/><\/Relationships>$/);
    const next = withDrawingRelationship('<Relationships><Relationship Id="rId1" Target="a"/><Relationship Id="rId2" Target="b"/></Relationships>', 'd');
    expect(next.id).toBe('rId3');
    expect(withDrawingRelationship('<Relationships xmlns="x"/>', 'd').xml).toBe('<Relationships xmlns="x"><Relationship Id="rId1" Type="http://schemas.openxmlformats.org/officeDocument/2006/relationships/drawing" Target="d"/></Relationships>');
  });

  it('declares png and the drawing part once', () => {
    const once = withDrawingContentTypes('<Types><Default Extension="xml" ContentType="application/xml"/></Types>', 'xl/drawings/drawing1.xml');
    expect(once).toContain('<Default Extension="png" ContentType="image/png"/>');
    expect(once).toContain('<Override PartName="/xl/drawings/drawing1.xml" ContentType="application/vnd.openxmlformats-officedocument.drawing+xml"/>');
    expect(withDrawingContentTypes(once, 'xl/drawings/drawing1.xml')).toBe(once);
  });

  it('finds a sheet part by name through the workbook rels', () => {
    const workbook = '<workbook><sheets><sheet sheetId="1" name="Front page" r:id="rId3"/><sheet sheetId="2" name="Charts" r:id="rId4"/></sheets></workbook>';
    const rels = '<Relationships><Relationship Id="rId3" Target="worksheets/sheet1.xml"/><Relationship Id="rId4" Target="worksheets/sheet2.xml"/></Relationships>';
    expect(sheetPartPath(workbook, rels, 'Charts')).toBe('xl/worksheets/sheet2.xml');
    expect(relsPathOf('xl/worksheets/sheet2.xml')).toBe('xl/worksheets/_rels/sheet2.xml.rels');
    expect(() => sheetPartPath(workbook, rels, 'Missing')).toThrow(/No sheet named/);
  });
});
