import type { SignInOverview } from '@tidemark/shared';
import { NOT_REPORTED, backupPhotosNote, durationInWords, mailSummary, photoStorageSummary, schemaSummary, secondFactorRule, sessionLimitsRule } from './installation-wording';

const REQUIRED: SignInOverview = { secondFactorPolicy: 'required', requiredRoles: ['admin', 'audit_lead'], sessionIdleMinutes: 30, sessionAbsoluteMinutes: 480 };

describe('installation wording', () => {
  it('says durations in hours and minutes', () => {
    expect(durationInWords(30)).toBe('30 minutes');
    expect(durationInWords(480)).toBe('8 hours');
    expect(durationInWords(61)).toBe('1 hour 1 minute');
    expect(durationInWords(0)).toBe('0 minutes');
  });

  it('names the roles that must use one-time codes, or says codes are only offered', () => {
    expect(secondFactorRule(REQUIRED)).toBe('Required of administrators and audit leads, who set codes up at their first sign-in; offered to everyone else.');
    expect(secondFactorRule({ ...REQUIRED, secondFactorPolicy: 'offered' })).toContain('Offered to everyone and required of no one');
  });

  it('states both session limits', () => {
    expect(sessionLimitsRule(REQUIRED)).toBe('Signed out after 30 minutes without activity, and 8 hours after signing in however busy.');
  });

  it('describes photo storage and mail, or says they were not reported', () => {
    expect(photoStorageSummary({ kind: 'object-storage', bucket: 'harbour-photos', prefix: 'tidemark/', region: 'eu-west-1', endpoint: null })).toBe(
      'In bucket “harbour-photos”, folder “tidemark/”, on Amazon S3 (eu-west-1). Objects are private and only served through Tidemark.',
    );
    expect(photoStorageSummary({ kind: 'object-storage', bucket: 'b', prefix: '', region: 'us-east-1', endpoint: 'https://minio.example.org:9000' })).toContain('on the object store at https://minio.example.org:9000');
    expect(photoStorageSummary(null)).toBe(NOT_REPORTED);
    expect(mailSummary({ kind: 'smtp', host: 'smtp.example.org', port: 465, isEncrypted: true, hasSignIn: false, from: 'x' })).toBe(
      'Through smtp.example.org, port 465, encrypted from the first byte, without a mail account.',
    );
    expect(mailSummary({ kind: 'stand-in', from: 'x' })).toContain('nothing leaves the machine');
    expect(mailSummary(null)).toBe(NOT_REPORTED);
  });

  it('says whether backups hold the photographs, by where they are kept', () => {
    expect(backupPhotosNote({ kind: 'data-folder' })).toContain('kept beside it, in a folder of the same name ending in “-photos”');
    expect(backupPhotosNote({ kind: 'object-storage', bucket: 'b', prefix: '', region: 'us-east-1', endpoint: null })).toBe(
      'Photographs are not in it: they are kept in object storage, whose own versioning keeps their history.',
    );
    expect(backupPhotosNote(null)).toContain('which this server did not report');
  });

  it('says whether the schema is up to date', () => {
    expect(schemaSummary({ latestMigration: 'Mail1764900000000', appliedCount: 4, knownCount: 5, isUpToDate: false })).toBe(
      'Behind this version of Tidemark (4 of 5 schema steps applied). Restart the server to bring it up to date.',
    );
    expect(schemaSummary({ latestMigration: 'SecondFactor1765200000000', appliedCount: 5, knownCount: 5, isUpToDate: true })).toBe('Up to date (5 of 5 schema steps applied).');
  });
});
