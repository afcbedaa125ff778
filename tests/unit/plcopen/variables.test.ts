import { describe, expect, it } from 'vitest';
import { importPlcopen } from '@shared/ladder/plcopen';
import type { Program } from '@shared/ladder/schema';

const NS = 'http://www.plcopen.org/xml/tc6_0201';

/** A project with one rung: contacts on the given variables in series, then a coil, and optionally a TON fed by `preset`. */
function project(options: { contacts: string[]; coil: string; preset?: string; interface?: string; globals?: string }): string {
  let id = 10;
  const parts: string[] = ['<leftPowerRail localId="1"><position x="0" y="0"/><connectionPointOut formalParameter=""/></leftPowerRail>'];
  let previous = 1;
  for (const variable of options.contacts) {
    id += 1;
    parts.push(`<contact localId="${id}"><position x="${id}" y="0"/><connectionPointIn><connection refLocalId="${previous}"/></connectionPointIn><connectionPointOut/><variable>${variable}</variable></contact>`);
    previous = id;
  }
  let feed = `<connection refLocalId="${previous}"/>`;
  if (options.preset !== undefined) {
    parts.push(`<inVariable localId="90"><position x="0" y="0"/><connectionPointOut/><expression>${options.preset}</expression></inVariable>`);
    parts.push(`<block localId="91" typeName="TON" instanceName="T1"><position x="0" y="0"/><inputVariables>
      <variable formalParameter="IN"><connectionPointIn>${feed}</connectionPointIn></variable>
      <variable formalParameter="PT"><connectionPointIn><connection refLocalId="90"/></connectionPointIn></variable>
      </inputVariables><inOutVariables/><outputVariables><variable formalParameter="Q"><connectionPointOut/></variable></outputVariables></block>`);
    feed = '<connection refLocalId="91" formalParameter="Q"/>';
  }
  parts.push(`<coil localId="99"><position x="99" y="0"/><connectionPointIn>${feed}</connectionPointIn><connectionPointOut/><variable>${options.coil}</variable></coil>`);
  return `<project xmlns="${NS}"><fileHeader companyName="c" productName="p" productVersion="1" creationDateTime="2024-01-01T00:00:00"/>
<contentHeader name="t"><coordinateInfo><fbd><scaling x="1" y="1"/></fbd><ld><scaling x="1" y="1"/></ld><sfc><scaling x="1" y="1"/></sfc></coordinateInfo></contentHeader>
<types><dataTypes/><pous><pou name="P" pouType="program"><interface>${options.interface ?? ''}</interface><body><LD>${parts.join('')}</LD></body></pou></pous></types>
<instances><configurations><configuration name="C">${options.globals ?? ''}</configuration></configurations></instances></project>`;
}

function load(xml: string): { program: Program; warnings: string[] } {
  const result = importPlcopen(xml);
  if (!result.ok) throw new Error(result.error);
  return result.value;
}

const operands = (p: Program): string[] => (p.rungs[0]?.network.items ?? []).map((n) => ('operand' in n ? n.operand : n.kind === 'block' ? `${n.type}(${JSON.stringify(n.inputs)})` : n.kind));
const bool = (name: string, address?: string): string =>
  `<variable name="${name}"${address ? ` address="${address}"` : ''}><type><BOOL/></type></variable>`;

describe('resolving the variables of an imported file', () => {
  it('gives an undeclared name the lowest memory bit the file does not use, and the same bit each time it appears', () => {
    const { program, warnings } = load(project({ contacts: ['%MX1', 'Jog', 'jog'], coil: '%MX2' }));
    expect(program.tags).toEqual([{ name: 'Jog', address: '%MX3', comment: '' }]);
    expect(operands(program)).toEqual(['%MX1', 'Jog', 'Jog', '%MX2']);
    expect(warnings).toEqual(['"Jog" is used but not declared: it becomes the tag Jog on memory bit %MX3']);
  });

  it('does not give a memory bit that a declared tag already holds', () => {
    const vars = `<localVars>${bool('Run', '%MX1')}${bool('Hold')}</localVars>`;
    const { program } = load(project({ contacts: ['Hold'], coil: 'Run', interface: vars }));
    expect(program.tags).toEqual([
      { name: 'Run', address: '%MX1', comment: '' },
      { name: 'Hold', address: '%MX2', comment: '' },
    ]);
  });

  it('finds the address of an external variable in the configuration\'s global variables', () => {
    const external = `<externalVars>${bool('Pump')}</externalVars>`;
    const globals = `<globalVars>${bool('Pump', '%QX2')}</globalVars>`;
    const { program, warnings } = load(project({ contacts: ['%IX1'], coil: 'Pump', interface: external, globals }));
    expect(program.tags).toEqual([{ name: 'Pump', address: '%QX2', comment: '' }]);
    expect(warnings).toEqual([]);
  });

  it('uses the initial value of a TIME variable without an address as the timer preset, and says so', () => {
    const vars = '<localVars><variable name="Delay"><type><TIME/></type><initialValue><simpleValue value="T#3s"/></initialValue></variable></localVars>';
    const { program, warnings } = load(project({ contacts: ['%IX1'], coil: '%QX1', preset: 'Delay', interface: vars }));
    expect(operands(program)).toEqual(['%IX1', 'TON({"PT":"T#3s"})', '%QX1']);
    expect(warnings).toEqual(['input PT of block TON "T1" (localId 91): "Delay" (TIME) has no address; its initial value T#3s is used as the operand']);
  });

  it('keeps constants and direct addresses in block inputs as written', () => {
    const { program, warnings } = load(project({ contacts: ['%IX1'], coil: '%QX1', preset: 'T#1m30s' }));
    expect(operands(program)[1]).toBe('TON({"PT":"T#1m30s"})');
    expect(warnings).toEqual([]);
  });

  it('warns about a declared variable with no address that no rung uses', () => {
    const vars = `<localVars>${bool('Spare')}</localVars>`;
    const { warnings } = load(project({ contacts: ['%IX1'], coil: '%QX1', interface: vars }));
    expect(warnings).toEqual(['variable "Spare" has no address and no rung uses it; it was left out']);
  });

  it('warns about a block member of an instance the program does not have', () => {
    const { program, warnings } = load(project({ contacts: ['T9.Q'], coil: '%QX1' }));
    expect(operands(program)[0]).toBe('T9.Q');
    expect(warnings).toEqual(['contact (localId 11): "T9.Q" names no block instance of this program; it is left as written']);
  });

  it('leaves a name as written, with a warning, when every memory bit is taken', () => {
    const taken = Array.from({ length: 64 }, (_, i) => bool(`M${i + 1}`, `%MX${i + 1}`)).join('');
    const { program, warnings } = load(project({ contacts: ['Extra'], coil: '%QX1', interface: `<localVars>${taken}</localVars>` }));
    expect(operands(program)[0]).toBe('Extra');
    expect(warnings).toContain('contact (localId 11): no memory bit is free for "Extra" (all 64 are used); it is left as written');
  });

  it('keeps a variable\'s documentation as the tag comment, shortened to 200 characters with a warning', () => {
    const long = 'x'.repeat(250);
    const vars = `<localVars><variable name="Lamp" address="%QX4"><type><BOOL/></type><documentation><xhtml:p xmlns:xhtml="http://www.w3.org/1999/xhtml">${long}</xhtml:p></documentation></variable></localVars>`;
    const { program, warnings } = load(project({ contacts: ['%IX1'], coil: 'Lamp', interface: vars }));
    expect(program.tags[0]?.comment).toBe('x'.repeat(200));
    expect(warnings).toEqual(['the comment of variable "Lamp" was shortened to 200 characters']);
  });
});
