import { Component, signal } from '@angular/core';
import { TestBed } from '@angular/core/testing';
import { FormArray, FormControl, FormGroup } from '@angular/forms';
import { formRevision } from './form-revision';

@Component({ selector: 'tm-revision-host', template: '' })
class RevisionHost {
  readonly form = signal(
    new FormGroup({ rows: new FormArray([new FormGroup({ value: new FormControl<number | null>(null) })]) }),
  );
  readonly revision = formRevision(this.form);
}

describe('formRevision', () => {
  async function host(): Promise<RevisionHost> {
    const fixture = TestBed.createComponent(RevisionHost);
    await fixture.whenStable();
    return fixture.componentInstance;
  }

  it('moves when a nested control is touched from code, even if its parents were touched already', async () => {
    const component = await host();
    const row = component.form().controls.rows.at(0);
    row.markAsTouched();
    const before = component.revision();
    component.form().markAllAsTouched();
    expect(component.revision()).toBeGreaterThan(before);
  });

  it('moves when errors are set on a control added after the start', async () => {
    const component = await host();
    const added = new FormGroup({ value: new FormControl<number | null>(2) });
    component.form().controls.rows.push(added);
    const before = component.revision();
    added.controls.value.setErrors({ server: 'Check this.' }, { emitEvent: false });
    expect(component.revision()).toBe(before);
    added.controls.value.setErrors({ server: 'Check this.' });
    expect(component.revision()).toBeGreaterThan(before);
  });
});
