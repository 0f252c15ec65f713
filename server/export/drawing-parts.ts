/*
 * The SpreadsheetML parts that put pictures on a worksheet (ECMA-376 Part 1, §20.5 DrawingML
 * spreadsheet drawing, §18.3.1.36 <drawing>). exceljs' streaming writer cannot write them, so the
 * workbook is finished by adding these parts to its zip afterwards (see add-sheet-images.ts).
 */

/** One picture to place on a sheet. */
export interface SheetPicture {
  /** PNG bytes. */
  png: Buffer;
  /** Alternative text (read by screen readers and shown where pictures are off). */
  description: string;
  /** Top-left cell, 0-based. */
  col: number;
  row: number;
  widthPx: number;
  heightPx: number;
}

const RELATIONSHIPS_NS = 'http://schemas.openxmlformats.org/officeDocument/2006/relationships';
const PACKAGE_RELATIONSHIPS_NS = 'http://schemas.openxmlformats.org/package/2006/relationships';
const IMAGE_REL = 'http://schemas.openxmlformats.org/officeDocument/2006/relationships/image';
const DRAWING_REL = 'http://schemas.openxmlformats.org/officeDocument/2006/relationships/drawing';
const DRAWING_CONTENT_TYPE = 'application/vnd.openxmlformats-officedocument.drawing+xml';
/** English Metric Units per pixel at 96 dpi (914,400 EMU per inch). */
const EMU_PER_PX = 9525;

/** Escapes text for an XML attribute. */
export function xmlAttribute(text: string): string {
  return text.replace(/&/g, '&amp;').replace(/</g, '&lt;').replace(/>/g, '&gt;').replace(/"/g, '&quot;');
}

/** `xl/drawings/drawingN.xml`: one one-cell anchor per picture, images referenced as rId1…rIdN. */
export function drawingXml(pictures: readonly SheetPicture[]): string {
  const anchors = pictures.map((picture, index) => {
    const cx = picture.widthPx * EMU_PER_PX;
    const cy = picture.heightPx * EMU_PER_PX;
    const name = `Chart ${index + 1}`;
    return (
      '<xdr:oneCellAnchor>' +
      `<xdr:from><xdr:col>${picture.col}</xdr:col><xdr:colOff>0</xdr:colOff><xdr:row>${picture.row}</xdr:row><xdr:rowOff>0</xdr:rowOff></xdr:from>` +
      `<xdr:ext cx="${cx}" cy="${cy}"/>` +
      '<xdr:pic>' +
      `<xdr:nvPicPr><xdr:cNvPr id="${index + 2}" name="${name}" descr="${xmlAttribute(picture.description)}"/><xdr:cNvPicPr><a:picLocks noChangeAspect="1"/></xdr:cNvPicPr></xdr:nvPicPr>` +
      `<xdr:blipFill><a:blip r:embed="rId${index + 1}"/><a:stretch><a:fillRect/></a:stretch></xdr:blipFill>` +
      `<xdr:spPr><a:xfrm><a:off x="0" y="0"/><a:ext cx="${cx}" cy="${cy}"/></a:xfrm><a:prstGeom prst="rect"><a:avLst/></a:prstGeom></xdr:spPr>` +
      '</xdr:pic>' +
      '<xdr:clientData/>' +
      '</xdr:oneCellAnchor>'
    );
  });
  return (
    '<?xml version="1.0" encoding="UTF-8" standalone="yes"?>' +
    '<xdr:wsDr xmlns:xdr="http://schemas.openxmlformats.org/drawingml/2006/spreadsheetDrawing" ' +
    `xmlns:a="http://schemas.openxmlformats.org/drawingml/2006/main" xmlns:r="${RELATIONSHIPS_NS}">` +
    anchors.join('') +
    '</xdr:wsDr>'
  );
}

/** `xl/drawings/_rels/drawingN.xml.rels`: rIdK → the K-th media file. */
export function drawingRelsXml(mediaPaths: readonly string[]): string {
  const relationships = mediaPaths.map((target, index) => `<Relationship Id="rId${index + 1}" Type="${IMAGE_REL}" Target="${xmlAttribute(target)}"/>`);
  return `<?xml version="1.0" encoding="UTF-8" standalone="yes"?><Relationships xmlns="${PACKAGE_RELATIONSHIPS_NS}">${relationships.join('')}</Relationships>`;
}

/** Adds the png default and the drawing override to `[Content_Types].xml` (each once). */
export function withDrawingContentTypes(contentTypes: string, drawingPart: string): string {
  let additions = '';
  if (!/<Default\b[^>]*Extension="png"/i.test(contentTypes)) additions += '<Default Extension="png" ContentType="image/png"/>';
  if (!contentTypes.includes(`PartName="/${drawingPart}"`)) additions += `<Override PartName="/${drawingPart}" ContentType="${DRAWING_CONTENT_TYPE}"/>`;
  return insertBefore(contentTypes, '</Types>', additions);
}

/**
 * Adds a drawing relationship to a sheet's rels (or makes the rels part when the sheet has none),
 * returning the new XML and the relationship id it chose.
 */
export function withDrawingRelationship(sheetRels: string | null, drawingTarget: string): { xml: string; id: string } {
  const base = sheetRels ?? `<?xml version="1.0" encoding="UTF-8" standalone="yes"?><Relationships xmlns="${PACKAGE_RELATIONSHIPS_NS}"></Relationships>`;
  const used = new Set([...base.matchAll(/\bId="([^"]+)"/g)].map((match) => match[1]));
  let number = used.size + 1;
  while (used.has(`rId${number}`)) number += 1;
  const id = `rId${number}`;
  const relationship = `<Relationship Id="${id}" Type="${DRAWING_REL}" Target="${xmlAttribute(drawingTarget)}"/>`;
  // A rels part written as an empty element has no closing tag to insert before.
  const open = base.replace(/<Relationships([^>]*)\/>/, '<Relationships$1></Relationships>');
  return { xml: insertBefore(open, '</Relationships>', relationship), id };
}

/** Elements that must follow <drawing> in a worksheet (CT_Worksheet sequence, ECMA-376 §18.3.1.99). */
const AFTER_DRAWING = ['<legacyDrawing', '<legacyDrawingHF', '<drawingHF', '<picture', '<oleObjects', '<controls', '<webPublishItems', '<tableParts', '<extLst'];

/** Puts `<drawing r:id="…"/>` where the schema wants it in a worksheet part. */
export function withDrawingElement(sheetXml: string, relationshipId: string): string {
  if (/<drawing\b/.test(sheetXml)) throw new Error('The sheet already has a drawing.');
  let xml = sheetXml;
  if (!/<worksheet\b[^>]*xmlns:r=/.test(xml)) xml = xml.replace(/<worksheet\b/, `<worksheet xmlns:r="${RELATIONSHIPS_NS}"`);
  const element = `<drawing r:id="${relationshipId}"/>`;
  const positions = AFTER_DRAWING.map((tag) => xml.indexOf(tag)).filter((position) => position >= 0);
  if (positions.length) {
    const at = Math.min(...positions);
    return xml.slice(0, at) + element + xml.slice(at);
  }
  return insertBefore(xml, '</worksheet>', element);
}

/**
 * The part path of a named sheet, from `xl/workbook.xml` and its rels (sheet names are
 * XML-escaped in the workbook; ours are plain words).
 */
export function sheetPartPath(workbookXml: string, workbookRels: string, sheetName: string): string {
  const sheet = [...workbookXml.matchAll(/<sheet\b[^>]*>/g)].map((match) => match[0]).find((tag) => attribute(tag, 'name') === xmlAttribute(sheetName));
  const relationshipId = sheet ? attribute(sheet, 'r:id') : null;
  if (!relationshipId) throw new Error(`No sheet named "${sheetName}" in the workbook.`);
  const relationship = [...workbookRels.matchAll(/<Relationship\b[^>]*>/g)].map((match) => match[0]).find((tag) => attribute(tag, 'Id') === relationshipId);
  const target = relationship ? attribute(relationship, 'Target') : null;
  if (!target) throw new Error(`The workbook does not say where sheet "${sheetName}" is.`);
  return target.startsWith('/') ? target.slice(1) : `xl/${target}`;
}

/** `xl/worksheets/sheet3.xml` → `xl/worksheets/_rels/sheet3.xml.rels`. */
export function relsPathOf(partPath: string): string {
  const slash = partPath.lastIndexOf('/');
  return `${partPath.slice(0, slash)}/_rels/${partPath.slice(slash + 1)}.rels`;
}

function attribute(tag: string, name: string): string | null {
  const match = new RegExp(`\\s${name.replace(':', '\\:')}="([^"]*)"`).exec(tag);
  return match ? match[1] : null;
}

function insertBefore(xml: string, closing: string, addition: string): string {
  const at = xml.lastIndexOf(closing);
  if (at < 0) throw new Error(`Expected ${closing} in the part.`);
  return xml.slice(0, at) + addition + xml.slice(at);
}
