import type { ChangeRecordView, ComplicationView, OperatorView, PatientView, PhotoView, SiteMeasurementView, SiteView, StabilityThresholds, VisitView } from '@tidemark/shared';
import { DEFAULT_RECALL_SCHEDULE } from '@tidemark/shared';
import { crownGain, siteOutcome } from '@tidemark/analytics';
import type { ChangeRecord } from '../entities/change-record.entity';
import type { Complication } from '../entities/complication.entity';
import type { Patient } from '../entities/patient.entity';
import type { Photo } from '../entities/photo.entity';
import type { SiteMeasurement } from '../entities/site-measurement.entity';
import type { Site } from '../entities/site.entity';
import type { Visit } from '../entities/visit.entity';

/** Looks up a user's display name; unknown ids still render. */
export type OperatorLookup = (id: number) => OperatorView;

/** SQLite hands booleans back as 0/1. */
export function asBoolean(value: boolean | number | null): boolean | null {
  return value === null ? null : Boolean(value);
}

export function mapPatient(patient: Patient): PatientView {
  return {
    id: patient.id,
    code: patient.code,
    birthYear: patient.birthYear,
    sex: patient.sex,
    smoking: patient.smoking,
    cigarettesPerDay: patient.cigarettesPerDay,
    diabetes: patient.diabetes,
    phenotype: patient.phenotype,
    phenotypeMethod: patient.phenotypeMethod,
    version: patient.version,
  };
}

export function mapSite(site: Site): SiteView {
  return {
    id: site.id,
    tooth: site.tooth,
    location: site.location,
    referencePoint: site.referencePoint,
    baselineRefGm: site.baselineRefGm,
    probingDepth: site.probingDepth,
    ktWidth: site.ktWidth,
    marginToCrest: site.marginToCrest,
    papillaScore: site.papillaScore,
    plannedExcision: site.plannedExcision,
    postOpRefGm: site.postOpRefGm,
    crownGain: site.postOpRefGm === null ? null : crownGain(site.baselineRefGm, site.postOpRefGm),
    version: site.version,
  };
}

export function mapMeasurement(measurement: SiteMeasurement, site: Site, thresholds?: StabilityThresholds): SiteMeasurementView {
  return {
    id: measurement.id,
    siteId: measurement.siteId,
    refGm: measurement.refGm,
    probingDepth: measurement.probingDepth,
    bleedingOnProbing: asBoolean(measurement.bleedingOnProbing),
    ktWidth: measurement.ktWidth,
    papillaScore: measurement.papillaScore,
    outcome: siteOutcome({ baselineRefGm: site.baselineRefGm, postOpRefGm: site.postOpRefGm, recallRefGm: measurement.refGm }, thresholds),
  };
}

/** Label of an interval key in the default schedule (audits may bring their own later). */
export function intervalLabel(key: string): string {
  return DEFAULT_RECALL_SCHEDULE.find((interval) => interval.key === key)?.label ?? key;
}

export function mapVisit(visit: Visit, measurements: SiteMeasurementView[], operator: OperatorLookup): VisitView {
  return {
    id: visit.id,
    intervalKey: visit.intervalKey,
    intervalLabel: intervalLabel(visit.intervalKey),
    visitDate: visit.visitDate,
    examiner: operator(visit.examinerId),
    pain: visit.pain,
    satisfaction: visit.satisfaction,
    notes: visit.notes,
    measurements,
    version: visit.version,
  };
}

export function mapComplication(complication: Complication): ComplicationView {
  return {
    id: complication.id,
    visitId: complication.visitId,
    type: complication.type,
    grade: complication.grade,
    onsetDate: complication.onsetDate,
    resolutionDate: complication.resolutionDate,
    management: complication.management,
    version: complication.version,
  };
}

export function mapPhoto(photo: Photo, operator: OperatorLookup): PhotoView {
  return {
    id: photo.id,
    visitId: photo.visitId,
    kind: photo.kind,
    contentType: photo.contentType,
    bytes: photo.bytes,
    sha256: photo.sha256,
    width: photo.width,
    height: photo.height,
    monthTaken: photo.monthTaken,
    uploadedBy: operator(photo.uploadedById),
    createdAt: new Date(photo.createdAt).toISOString(),
  };
}

export function mapChangeRecord(record: ChangeRecord, operator: OperatorLookup): ChangeRecordView {
  return {
    id: record.id,
    entity: record.entity,
    entityId: record.entityId,
    caseId: record.caseId,
    field: record.field,
    oldValue: record.oldValue,
    newValue: record.newValue,
    changedBy: operator(record.changedById),
    changedAt: new Date(record.changedAt).toISOString(),
    reason: record.reason,
  };
}
