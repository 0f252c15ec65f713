import { addSite, createCaseEntryForm } from './case-entry-form';
import { STEP, caseCreateRequest, errorPlace } from './case-create-request';

describe('case create request', () => {
  it('maps server field paths to the control and step that show them', () => {
    expect(errorPlace('patient.code')).toEqual({ path: ['patient', 'newPatient', 'code'], step: STEP.patient });
    expect(errorPlace('patientId')).toEqual({ path: ['patient', 'existingId'], step: STEP.patient });
    expect(errorPlace('surgeryDate')).toEqual({ path: ['details', 'surgeryDate'], step: STEP.details });
    expect(errorPlace('sites')).toEqual({ path: ['sites'], step: STEP.sites });
    expect(errorPlace('sites.0.tooth')).toEqual({ path: ['sites', 0, 'tooth'], step: STEP.sites });
    expect(errorPlace('sites.2.ktWidth')).toEqual({ path: ['sites', 2, 'ktWidth'], step: STEP.baseline });
    expect(errorPlace('examinerId')).toBeNull();
  });

  it('sends an existing patient by id, and nulls what does not apply', () => {
    const form = createCaseEntryForm(4);
    form.controls.patient.controls.mode.setValue('existing');
    form.controls.patient.controls.existingId.setValue(3);
    form.controls.details.patchValue({ procedure: 'gingivectomy', indication: 'aesthetic', instrument: 'laser', surgeryDate: '2026-01-12' });
    addSite(form, 11, 'mid-facial');
    addSite(form, 11, 'distal-papilla');
    form.controls.sites.controls.forEach((site) => site.patchValue({ baselineRefGm: 8, papillaScore: 3, postOpRefGm: 10 }));

    const candidate = caseCreateRequest(form);
    expect(candidate.isValid).toBe(true);
    if (candidate.isValid) {
      expect(candidate.request.patientId).toBe(3);
      expect(candidate.request.patient).toBeUndefined();
      expect(candidate.request.sites.map((site) => [site.location, site.papillaScore, site.postOpRefGm])).toEqual([
        ['mid-facial', null, null],
        ['distal-papilla', 3, null],
      ]);
    }
  });
});
