import type { DataSource, EntityManager } from 'typeorm';
import { z } from 'zod';
import type { PatientView } from '@tidemark/shared';
import { patientCreateSchema, patientUpdateSchema } from '@tidemark/shared';
import { Patient } from '../entities/patient.entity';
import { SurgicalCase } from '../entities/surgical-case.entity';
import { HttpError } from '../http-error';
import { appendChanges, changedValues, diffFields } from './change-log';
import { clinicalAccess } from './clinical-access';
import { mapPatient } from './clinical-mappers';
import { updateWithVersion } from './versioned-update';

type PatientCreate = z.output<typeof patientCreateSchema>;
type PatientUpdate = z.output<typeof patientUpdateSchema>;

/** Pseudonymised patients. Clinicians see the patients they registered or operate on. */
export class PatientService {
  constructor(private readonly dataSource: DataSource) {}

  private visibleQuery(manager: EntityManager, user: Express.User) {
    const builder = manager.getRepository(Patient).createQueryBuilder('p');
    if (user.role === 'clinician') {
      builder.where('(p.created_by_id = :self OR EXISTS (SELECT 1 FROM surgical_case c WHERE c.patient_id = p.id AND c.operator_id = :self))', { self: user.id });
    }
    return builder;
  }

  async list(user: Express.User, code?: string): Promise<PatientView[]> {
    clinicalAccess.assertPatientLevel(user);
    const builder = this.visibleQuery(this.dataSource.manager, user);
    if (code) builder.andWhere('p.code LIKE :code', { code: `%${code.toUpperCase().replace(/[%_]/g, '')}%` });
    const patients = await builder.orderBy('p.code', 'ASC').limit(50).getMany();
    return patients.map(mapPatient);
  }

  /** A patient the user may see, or 404. */
  async findVisible(manager: EntityManager, user: Express.User, id: number): Promise<Patient> {
    clinicalAccess.assertPatientLevel(user);
    const patient = await this.visibleQuery(manager, user).andWhere('p.id = :id', { id }).getOne();
    if (!patient) throw HttpError.notFound('The patient');
    return patient;
  }

  async get(user: Express.User, id: number): Promise<PatientView> {
    return mapPatient(await this.findVisible(this.dataSource.manager, user, id));
  }

  /** Inserts in the caller's transaction; 409 when the code is taken. */
  async insert(manager: EntityManager, user: Express.User, body: PatientCreate): Promise<Patient> {
    clinicalAccess.assertWriter(user);
    if (await manager.getRepository(Patient).existsBy({ code: body.code })) {
      throw new HttpError(409, 'conflict', 'A patient with this code is already registered.', { code: 'This code is taken. Pick the existing patient or use another code.' });
    }
    return manager.getRepository(Patient).save(manager.getRepository(Patient).create({ ...body, createdById: user.id, version: 1 }));
  }

  async create(user: Express.User, body: PatientCreate): Promise<PatientView> {
    return mapPatient(await this.dataSource.transaction((manager) => this.insert(manager, user, body)));
  }

  async update(user: Express.User, id: number, body: PatientUpdate): Promise<PatientView> {
    await this.dataSource.transaction(async (manager) => {
      clinicalAccess.assertWriter(user);
      const current = await this.findVisible(manager, user, id);
      if (user.role === 'clinician') {
        // A clinician edits only patients they registered or operate on (as findVisible), never others'.
        const isOwn = current.createdById === user.id || (await manager.getRepository(SurgicalCase).existsBy({ patientId: id, operatorId: user.id }));
        if (!isOwn) throw HttpError.notFound('The patient');
      }
      const { version, reason, ...change } = body;
      const merged = { ...current, ...Object.fromEntries(Object.entries(change).filter(([, value]) => value !== undefined)) };
      if ((merged.smoking === 'current') !== (merged.cigarettesPerDay !== null && merged.cigarettesPerDay !== undefined)) {
        throw HttpError.badRequest('Check smoking details.', { cigarettesPerDay: 'Give cigarettes a day for a current smoker, and only then.' });
      }
      const changes = diffFields(current, change);
      await updateWithVersion(manager, Patient, id, version, changedValues(changes));
      await appendChanges(manager, { entity: 'patient', entityId: id, caseId: null, userId: user.id, reason }, changes);
    });
    return this.get(user, id);
  }
}
