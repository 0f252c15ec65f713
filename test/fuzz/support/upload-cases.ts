import fc from 'fast-check';
import sharp from 'sharp';
import { IMPORT_COLUMNS, PHOTO_KINDS } from '@tidemark/shared';
import { xlsxTemplate } from '../../../server/import/import-template';
import { demoEmail } from '../../api/support/test-app';
import { NON_JSON_CONTENT_TYPES, TRAVERSAL_STRINGS, longString, nastyString, unicodeString } from '../generators';
import { ANY_4XX, FuzzCase, type FuzzMode } from './fuzz-case';
import type { FixtureIds } from './fuzz-world';
import type { UploadRoute } from './fuzz-route';
import { accessCases, routePath, type WeightedCases } from './json-cases';
import { multipartRequest, type FormPart, type MultipartDamage } from './multipart';

/** Files made once per run: a real image and the import workbook template. */
export interface UploadAssets {
  png: Buffer;
  xlsxTemplate: Buffer;
}

/** Builds the {@link UploadAssets} (sharp for a 2×2 PNG, the server's own template). */
export async function createUploadAssets(): Promise<UploadAssets> {
  const png = await sharp({ create: { width: 2, height: 2, channels: 3, background: { r: 200, g: 120, b: 120 } } }).png().toBuffer();
  return { png, xlsxTemplate: await xlsxTemplate() };
}

const statuses = (...codes: number[]): ReadonlySet<number> => new Set(codes);

/** File names a browser would never send, and some it would. */
const fileName: fc.Arbitrary<string> = fc.oneof(
  fc.constantFrom(...TRAVERSAL_STRINGS, 'photo.jpg', 'photo.jpg\u0000.php', 'a"b.jpg', 'x\r\nContent-Type: text/html', '', '.htaccess', 'CON', '%00.png'),
  unicodeString,
  longString(256, 4000),
);

/** Declared part types: lies about the content are normal here (the server decides by content). */
const partType: fc.Arbitrary<string | undefined> = fc.constantFrom(undefined, 'image/jpeg', 'image/png', 'image/svg+xml', 'text/html', 'application/x-php', 'text/csv', 'application/octet-stream');

/** Bytes no image decoder and no import reader accepts as their format. */
const NOT_IMAGES: readonly Buffer[] = [
  Buffer.from('root:x:0:0:root:/root:/bin/bash\n'),
  Buffer.from('GIF89a\u0001\u0000\u0001\u0000\u0000\u0000\u0000;'),
  Buffer.from('%PDF-1.4\n%âãÏÓ\n1 0 obj\n<<>>\nendobj\n'),
  Buffer.from('<svg xmlns="http://www.w3.org/2000/svg" onload="alert(1)"/>'),
  Buffer.from([0x50, 0x4b, 0x03, 0x04, 0x14, 0x00, 0x00, 0x00, 0x08, 0x00]),
  Buffer.from([0x00, 0x01, 0x02, 0x03, 0xfe, 0xff]),
];

const notImage: fc.Arbitrary<Buffer> = fc.oneof(fc.constantFrom(...NOT_IMAGES), fc.uint8Array({ minLength: 1, maxLength: 64 }).map((array) => Buffer.concat([Buffer.from('TM'), Buffer.from(array)])));

function field(name: string, value: string): FormPart {
  return { name, value };
}

/** A photo upload's form fields as the page sends them (kind, optional visit and month). */
function validPhotoFields(visitId: number): fc.Arbitrary<readonly FormPart[]> {
  return fc
    .record({ kind: fc.constantFrom(...PHOTO_KINDS), hasVisit: fc.boolean(), hasMonth: fc.boolean() })
    .map(({ kind, hasVisit, hasMonth }) => [field('kind', kind), ...(hasVisit ? [field('visitId', String(visitId))] : []), ...(hasMonth ? [field('monthTaken', '2024-05')] : [])]);
}

/** A visit id text `z.coerce.number().int().positive()` refuses. */
const badVisitId = fc.oneof(fc.constantFrom('abc', '-1', '0', '1.5', 'NaN', 'Infinity', '', ' ', '1e400', '9007199254740993'), nastyString).filter((text) => {
  const value = Number(text);
  return !(Number.isSafeInteger(value) && value > 0);
});

/** Photo form fields that break `photoUploadSchema` or multer's limits, whatever the file. */
function brokenPhotoFields(visitId: number): fc.Arbitrary<readonly FormPart[]> {
  const kinds: ReadonlySet<string> = new Set(PHOTO_KINDS);
  const badKind = fc.oneof(nastyString, fc.constantFrom('RECALL', 'recall ', 'x-ray')).filter((text) => !kinds.has(text));
  return fc.oneof(
    fc.constant([field('monthTaken', '2024-05')]),
    badKind.map((kind) => [field('kind', kind)]),
    badVisitId.map((text) => [field('kind', 'recall'), field('visitId', text)]),
    fc.oneof(nastyString, fc.constantFrom('2024-13', '2024-1', '24-05', '2024-05-01')).filter((text) => !/^\d{4}-(0[1-9]|1[0-2])$/.test(text)).map((month) => [field('kind', 'recall'), field('monthTaken', month)]),
    fc.constant([field('kind', 'recall'), field('kind', 'recall')]),
    fc.constant([field('kind[]', 'recall')]),
    fc.constant([field('kind', 'recall'), ...Array.from({ length: 11 }, (_, index) => field(`extra${index}`, 'x'))]),
    longString(1025, 5000).map((text) => [field('kind', 'recall'), field('visitId', String(visitId)), field('note', text)]),
  );
}

/** Extra fields an attacker adds: prototype paths and hostile names (multer builds nested objects from brackets). */
const noiseFields: fc.Arbitrary<readonly FormPart[]> = fc.array(
  fc.tuple(fc.oneof(fc.constantFrom('__proto__[tmFuzzPolluted]', 'constructor[prototype][tmFuzzPolluted]', '__proto__', 'a[999999999]'), nastyString), nastyString).map(([name, value]) => field(name, value)),
  { maxLength: 2 },
);

/** File parts that can never be a stored photo or a read import. */
function badFileParts(): fc.Arbitrary<readonly FormPart[]> {
  return fc.oneof(
    fc.constant([]),
    fc.tuple(fileName, partType).map(([filename, contentType]) => [{ name: 'file', value: Buffer.alloc(0), filename, contentType }]),
    fc.tuple(notImage, fileName, partType).map(([value, filename, contentType]) => [{ name: 'file', value, filename, contentType }]),
  );
}

function multipartCase(route: UploadRoute, path: string, mode: FuzzMode, parts: readonly FormPart[], allowed: ReadonlySet<number>, damage: MultipartDamage = 'none', allows2xx = false): FuzzCase {
  const { contentType, body } = multipartRequest(parts, damage);
  return new FuzzCase(mode, { method: route.method, path, headers: { 'content-type': contentType }, body }, allowed, route.actor, 'valid', allows2xx);
}

const DAMAGES: MultipartDamage[] = ['no-closing-boundary', 'truncated', 'wrong-boundary', 'no-boundary-parameter', 'header-without-blank-line'];

/** Cases on the framing, the file-part name and the request type, shared by both upload routes. */
function framingCases(route: UploadRoute, path: string, goodParts: fc.Arbitrary<readonly FormPart[]>): WeightedCases {
  return [
    { arbitrary: fc.tuple(goodParts, fc.constantFrom(...DAMAGES)).map(([parts, damage]) => multipartCase(route, path, 'multipart-framing', parts, statuses(400), damage)), weight: 12 },
    {
      // Two files, or the file under another field name: multer refuses both.
      arbitrary: fc.tuple(goodParts, fc.constantFrom('two-files', 'photo', 'file[]', '__proto__')).map(([parts, variant]) => {
        const file = parts.find((part) => part.filename !== undefined);
        const others = parts.filter((part) => part !== file);
        const renamed = file ? (variant === 'two-files' ? [file, file] : [{ ...file, name: variant }]) : [];
        return multipartCase(route, path, 'form-fields', [...others, ...renamed], statuses(400));
      }),
      weight: 8,
    },
    {
      arbitrary: fc.constantFrom(...NON_JSON_CONTENT_TYPES.filter((type) => !type.startsWith('multipart/')), 'application/json').map(
        (type) => new FuzzCase('content-type', { method: route.method, path, headers: type ? { 'content-type': type } : {}, body: Buffer.from('{"kind":"recall"}') }, statuses(400, 415), route.actor),
      ),
      weight: 5,
    },
  ];
}

/** Cases for `POST /api/cases/:id/photos`: fields, files, names and framing, each case refused for a stated reason. */
export function photoRouteCases(route: UploadRoute, ids: FixtureIds, assets: UploadAssets): fc.Arbitrary<FuzzCase> {
  const path = routePath(route, route.existingId?.(ids));
  const imageFile = fc.tuple(fileName, partType).map(([filename, contentType]): FormPart => ({ name: 'file', value: assets.png, filename, contentType }));
  // A real image plus valid fields: sent only where something else (framing, id, actor, CSRF) is wrong.
  const goodParts = fc.tuple(validPhotoFields(ids.visit.id), imageFile).map(([fields, file]) => [...fields, file]);
  const valid = multipartRequest([field('kind', 'recall'), { name: 'file', value: assets.png, filename: 'photo.png', contentType: 'image/png' }]);
  const cases: WeightedCases = [
    {
      arbitrary: fc.tuple(brokenPhotoFields(ids.visit.id), fc.oneof(imageFile.map((file) => [file]), badFileParts()), noiseFields).map(([fields, files, noise]) => multipartCase(route, path, 'form-fields', [...noise, ...fields, ...files], statuses(400, 413, 415))),
      weight: 35,
    },
    { arbitrary: fc.tuple(validPhotoFields(ids.visit.id), badFileParts(), noiseFields).map(([fields, files, noise]) => multipartCase(route, path, 'file', [...noise, ...fields, ...files], statuses(400, 415))), weight: 30 },
    ...framingCases(route, path, goodParts),
    ...accessCases(route, ids, () => ({ headers: { 'content-type': valid.contentType }, body: valid.body })),
  ];
  return fc.oneof(...cases);
}

/** A CSV cell written as RFC 4180 says (quotes doubled, quoted when needed); no formula escaping, on purpose. */
function csvCell(value: string): string {
  return /[",\r\n]/.test(value) ? `"${value.replace(/"/g, '""')}"` : value;
}

/** A valid import row (same shape as the import API spec's), column → cell text. */
function validImportRow(): Record<string, string> {
  return {
    patient_code: 'FZ-1001', birth_year: '1975', sex: 'female', smoking: 'never', cigarettes_per_day: '', diabetes: 'none', phenotype: 'thin', phenotype_method: 'probe-visibility',
    operator_email: demoEmail('clinician'), surgery_date: '2024-01-10', procedure: 'gingivectomy', indication: 'aesthetic', instrument: 'scalpel',
    tooth: '11', site_location: 'mid-facial', reference_point: 'incisal-edge', baseline_ref_gm: '8', post_op_ref_gm: '10', kt_width: '5', margin_to_crest: '4', baseline_papilla: '',
    interval_key: '6w', visit_date: '2024-02-21', recall_ref_gm: '9.5', recall_papilla: '', bleeding_on_probing: 'no', pain: '1',
  };
}

/** Cells that make a row invalid on their own (FDI ISO 3950 has no tooth 19, 99 or 0; 20 mm is the plausible maximum, DESIGN.md §3). */
const ROW_BREAKS: fc.Arbitrary<[string, string]> = fc.oneof(
  fc.constantFrom('19', '99', '0', '10', 'abc', '11.5', "' OR 1=1 --", '../../etc/passwd', '😀').map((tooth): [string, string] => ['tooth', tooth]),
  fc.constantFrom('20.5', '-1', 'NaN', '1e309', '=1+1').map((mm): [string, string] => ['baseline_ref_gm', mm]),
  fc.constantFrom('2024-02-30', '10/01/2024', '"; DROP TABLE x; --', '2999-01-01').map((date): [string, string] => ['surgery_date', date]),
  fc.constantFrom('x', '../../x', 'ab', "O'BRIEN;--").map((code): [string, string] => ['patient_code', code]),
);

/** A CSV the import must reject: every data row carries a break, or the header is wrong, or quoting is broken. */
const invalidCsv: fc.Arbitrary<Buffer> = fc.oneof(
  fc
    .array(fc.tuple(ROW_BREAKS, fc.array(fc.tuple(fc.constantFrom(...IMPORT_COLUMNS), fc.oneof(nastyString, fc.constantFrom('=cmd|" /C calc"!A0', '+1', '@SUM(1)'))), { maxLength: 3 })), { minLength: 1, maxLength: 5 })
    .map((rows) => {
      const lines = rows.map(([[column, value], noise]) => {
        const cells: Record<string, string> = { ...validImportRow(), ...Object.fromEntries(noise) };
        cells[column] = value;
        return IMPORT_COLUMNS.map((name) => csvCell(cells[name] ?? '')).join(',');
      });
      return Buffer.from([IMPORT_COLUMNS.join(','), ...lines].join('\r\n') + '\r\n');
    }),
  // Header faults readImportTable reports whatever the rows hold: a renamed (unknown) column, a repeated one, a prototype key.
  fc.tuple(fc.nat({ max: IMPORT_COLUMNS.length - 1 }), fc.constantFrom('rename', 'duplicate', 'unknown')).map(([index, change]) => {
    const header: string[] = [...IMPORT_COLUMNS];
    if (change === 'rename') header[index] = `${header[index]}_x`;
    if (change === 'duplicate') header.push(header[index]);
    if (change === 'unknown') header.push('__proto__');
    const row = validImportRow();
    return Buffer.from(`${header.join(',')}\r\n${header.map((name) => csvCell(row[name] ?? '')).join(',')}\r\n`);
  }),
  fc.constant(Buffer.from(`${IMPORT_COLUMNS.join(',')}\r\n"FZ-1001,1975\r\n`)),
  fc.constant(Buffer.from(`${IMPORT_COLUMNS.join(',')}\r\n`)),
);

/** Cases for `POST /api/imports`: a 202 is right only for a readable file, and that job must end rejected. */
export function importRouteCases(route: UploadRoute, ids: FixtureIds, assets: UploadAssets): fc.Arbitrary<FuzzCase> {
  const path = route.path;
  const fileFrom = (bytes: fc.Arbitrary<Buffer>) => fc.tuple(bytes, fileName, partType).map(([value, filename, contentType]): FormPart => ({ name: 'file', value, filename, contentType }));
  const readable = fc.oneof(invalidCsv, fc.constant(assets.xlsxTemplate), fc.nat({ max: assets.xlsxTemplate.length - 2 }).map((cut) => assets.xlsxTemplate.subarray(0, cut + 1)));
  const goodParts = fileFrom(invalidCsv).map((file) => [file]);
  const valid = multipartRequest([{ name: 'file', value: Buffer.from(`${IMPORT_COLUMNS.join(',')}\r\n`), filename: 'rows.csv', contentType: 'text/csv' }]);
  const cases: WeightedCases = [
    { arbitrary: fc.tuple(fileFrom(readable), noiseFields).map(([file, noise]) => multipartCase(route, path, 'file', [...noise, file], ANY_4XX, 'none', true)), weight: 35 },
    // Text among these (a passwd line, random bytes that happen to be UTF-8) reads as a CSV: 202, then rejected.
    { arbitrary: fc.tuple(badFileParts(), noiseFields).map(([files, noise]) => multipartCase(route, path, 'file', [...noise, ...files], statuses(400, 415), 'none', true)), weight: 20 },
    {
      arbitrary: fc.tuple(fileFrom(invalidCsv), fc.constantFrom(6, 7)).map(([file, count]) => multipartCase(route, path, 'form-fields', [...Array.from({ length: count }, (_, index) => field(`f${index}`, 'x')), file], statuses(400))),
      weight: 6,
    },
    ...framingCases(route, path, goodParts),
    ...accessCases(route, ids, () => ({ headers: { 'content-type': valid.contentType }, body: valid.body })),
  ];
  return fc.oneof(...cases);
}
