import { finished } from 'node:stream/promises';
import archiver from 'archiver';
import unzipper from 'unzipper';
import { SyncFileSink } from './sync-file-sink';
import { drawingRelsXml, drawingXml, relsPathOf, sheetPartPath, withDrawingContentTypes, withDrawingElement, withDrawingRelationship, type SheetPicture } from './drawing-parts';

/** What {@link addSheetImages} needs. */
export interface AddSheetImagesOptions {
  /** The workbook as exceljs' streaming writer left it. */
  source: string;
  /** Where the finished workbook goes. */
  target: string;
  /** The (small) sheet that receives the pictures. */
  sheetName: string;
  pictures: readonly SheetPicture[];
  /** Deflate level of the finished file (the source may be stored uncompressed). */
  compressionLevel?: number;
}

/** The sheet that gets pictures is ours and holds a note; a big part here means a wrong sheet. */
const MAX_EDITED_PART_BYTES = 1024 * 1024;

/**
 * Copies an .xlsx entry by entry into a new zip, adding pictures to one sheet: the PNGs
 * (`xl/media`), a drawing part with its rels, the sheet's `<drawing>` element and rels, and the
 * content types for png and drawings. Only the few small parts that change are read into memory;
 * every other entry (the big data sheets) streams through, so memory stays flat whatever the size.
 * The source is opened by its central directory, which holds every entry's size even when the
 * writer used data descriptors (as archiver does).
 */
export async function addSheetImages(options: AddSheetImagesOptions): Promise<void> {
  const directory = await unzipper.Open.file(options.source);
  const files = directory.files.filter((file) => file.type === 'File');
  const byPath = new Map(files.map((file) => [file.path, file]));
  const readText = async (path: string): Promise<string | null> => {
    const file = byPath.get(path);
    if (!file) return null;
    if (file.uncompressedSize > MAX_EDITED_PART_BYTES) throw new Error(`${path} is too large to edit in memory.`);
    return (await file.buffer()).toString('utf8');
  };

  const workbookXml = await readText('xl/workbook.xml');
  const workbookRels = await readText('xl/_rels/workbook.xml.rels');
  const contentTypes = await readText('[Content_Types].xml');
  if (workbookXml === null || workbookRels === null || contentTypes === null) throw new Error('Not a workbook: a core part is missing.');
  const sheetPath = sheetPartPath(workbookXml, workbookRels, options.sheetName);
  const sheetRelsPath = relsPathOf(sheetPath);
  const sheetXml = await readText(sheetPath);
  if (sheetXml === null) throw new Error(`The sheet part ${sheetPath} is missing.`);

  let drawingNumber = 1;
  while (byPath.has(`xl/drawings/drawing${drawingNumber}.xml`)) drawingNumber += 1;
  const drawingPath = `xl/drawings/drawing${drawingNumber}.xml`;
  const mediaNames: string[] = [];
  let imageNumber = 1;
  for (let index = 0; index < options.pictures.length; index += 1) {
    while (byPath.has(`xl/media/image${imageNumber}.png`)) imageNumber += 1;
    mediaNames.push(`image${imageNumber}.png`);
    imageNumber += 1;
  }
  const relationship = withDrawingRelationship(await readText(sheetRelsPath), `../drawings/drawing${drawingNumber}.xml`);
  const replaced = new Map<string, string>([
    ['[Content_Types].xml', withDrawingContentTypes(contentTypes, drawingPath)],
    [sheetPath, withDrawingElement(sheetXml, relationship.id)],
    [sheetRelsPath, relationship.xml],
  ]);

  // Written synchronously for the same reason as the stage file: nothing piles up behind the disk.
  const output = new SyncFileSink(options.target);
  const archive = archiver('zip', { zlib: { level: options.compressionLevel ?? 6 } });
  const failure = new Promise<never>((_resolve, reject) => {
    archive.on('error', reject);
    output.on('error', reject);
  });
  archive.pipe(output);
  const copy = async (): Promise<void> => {
    for (const file of files) {
      const replacement = replaced.get(file.path);
      if (replacement !== undefined) {
        archive.append(Buffer.from(replacement, 'utf8'), { name: file.path });
        replaced.delete(file.path);
        continue;
      }
      // One entry at a time: the next is opened only once archiver has consumed this one.
      const entry = file.stream();
      archive.append(entry, { name: file.path });
      await finished(entry);
    }
    // Parts the source did not have (the sheet's rels when it had no hyperlinks).
    for (const [path, xml] of replaced) archive.append(Buffer.from(xml, 'utf8'), { name: path });
    options.pictures.forEach((picture, index) => archive.append(picture.png, { name: `xl/media/${mediaNames[index]}` }));
    archive.append(Buffer.from(drawingXml(options.pictures), 'utf8'), { name: drawingPath });
    archive.append(Buffer.from(drawingRelsXml(mediaNames.map((name) => `../media/${name}`)), 'utf8'), { name: relsPathOf(drawingPath) });
    await archive.finalize();
    await finished(output);
  };
  await Promise.race([copy(), failure]);
}
