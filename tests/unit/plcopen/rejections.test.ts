import { describe, expect, it } from 'vitest';
import { importPlcopen } from '@shared/ladder/plcopen';

const NS = 'http://www.plcopen.org/xml/tc6_0201';

/** A minimal project around an LD body (and optional interface). */
function project(ld: string, options: { interface?: string; namespace?: string; pou?: string } = {}): string {
  const pou = options.pou ?? `<pou name="P" pouType="program"><interface>${options.interface ?? ''}</interface><body><LD>${ld}</LD></body></pou>`;
  return `<?xml version="1.0" encoding="UTF-8"?>
<project xmlns="${options.namespace ?? NS}">
  <fileHeader companyName="c" productName="p" productVersion="1" creationDateTime="2024-01-01T00:00:00"/>
  <contentHeader name="t"><coordinateInfo><fbd><scaling x="1" y="1"/></fbd><ld><scaling x="1" y="1"/></ld><sfc><scaling x="1" y="1"/></sfc></coordinateInfo></contentHeader>
  <types><dataTypes/><pous>${pou}</pous></types>
  <instances><configurations/></instances>
</project>`;
}

const rail = '<leftPowerRail localId="1"><position x="0" y="0"/><connectionPointOut formalParameter=""/></leftPowerRail>';
const contact = (id: number, from: string, variable = '%IX1', attrs = ''): string =>
  `<contact localId="${id}" ${attrs}><position x="0" y="${id}"/><connectionPointIn>${from}</connectionPointIn><connectionPointOut/><variable>${variable}</variable></contact>`;
const coil = (id: number, from: string, variable = '%QX1', attrs = ''): string =>
  `<coil localId="${id}" ${attrs}><position x="0" y="${id}"/><connectionPointIn>${from}</connectionPointIn><connectionPointOut/><variable>${variable}</variable></coil>`;
const from = (...ids: Array<number | string>): string => ids.map((id) => `<connection refLocalId="${id}"/>`).join('');

function errorOf(xml: unknown, maxBytes?: number): string {
  const result = importPlcopen(xml as string, maxBytes === undefined ? {} : { maxBytes });
  if (result.ok) throw new Error('expected the import to fail');
  return result.error;
}

describe('refusing unsafe or broken input before parsing', () => {
  it('refuses a DOCTYPE with entity declarations (an XML bomb), with where it is', () => {
    const bomb = `<?xml version="1.0"?>
<!DOCTYPE lolz [<!ENTITY lol "lol"><!ENTITY lol2 "&lol;&lol;&lol;&lol;">]>
<project xmlns="${NS}">&lol2;</project>`;
    expect(errorOf(bomb)).toBe(
      'line 2, column 1: a DOCTYPE declaration is not accepted (PLCopen files need none; it could declare entities)',
    );
  });

  it('refuses an external entity through a DOCTYPE as well', () => {
    const external = `<!DOCTYPE project SYSTEM "file:///etc/passwd"><project xmlns="${NS}"/>`;
    expect(errorOf(external)).toMatch(/^line 1, column 1: a DOCTYPE declaration is not accepted/);
  });

  it('does not mistake a DOCTYPE inside a comment for a real one', () => {
    const xml = project('').replace('<project', '<!-- <!DOCTYPE nothing> --><project');
    expect(importPlcopen(xml).ok).toBe(true);
  });

  it('refuses an entity reference XML does not define', () => {
    expect(errorOf(project(contact(2, from(1), '&nbsp;') + rail))).toMatch(/: the entity reference "&nbsp;" is not defined in XML$/);
  });

  it('refuses a character XML does not allow, NUL above all, with where it is', () => {
    // XML 1.0 (Fifth Edition), 2.2 Characters, production [2] Char: no C0 control but tab, LF, CR.
    const xml = project(rail + contact(2, from(1), '%IX1\u0000'));
    expect(errorOf(xml)).toMatch(/^line \d+, column \d+: the character U\+0000 \(NUL\) is not allowed in XML$/);
    expect(errorOf(project(rail).replace('<project', '\u0001<project'))).toBe('line 2, column 1: the character U+0001 is not allowed in XML');
    expect(errorOf(project(rail + contact(2, from(1), 'A\uD800B')))).toMatch(/the character U\+D800 is not allowed in XML$/);
  });

  it('refuses a character reference to a character XML does not allow', () => {
    expect(errorOf(project(rail + contact(2, from(1), '%IX&#0;')))).toMatch(/: the character reference "&#0;" names U\+0000 \(NUL\), which is not allowed in XML$/);
    expect(errorOf(project(rail + contact(2, from(1), '%IX&#x1F;')))).toMatch(/names U\+001F, which is not allowed/);
    expect(errorOf(project(rail + contact(2, from(1), '%IX&#99999999999;')))).toMatch(/which is not allowed in XML$/);
  });

  it('refuses a bare ampersand', () => {
    expect(errorOf(project(contact(2, from(1), 'A & B') + rail))).toMatch(/: a bare "&" must be written &amp;$/);
  });

  it('accepts predefined entities and character references', () => {
    const result = importPlcopen(project(rail + contact(2, from(1), '%IX&#49;') + coil(3, from(2), '%QX&#x31;')));
    expect(result.ok && result.value.program.rungs[0]?.network.items.map((n) => ('operand' in n ? n.operand : ''))).toEqual(['%IX1', '%QX1']);
  });

  it('refuses input larger than the limit, saying the limit', () => {
    expect(errorOf(project(''), 100)).toBe('the file is too large: more than 100 bytes (the limit is 100 bytes)');
  });

  it('refuses input over the default 1 MB limit', () => {
    const big = project(`<comment localId="9" height="1" width="1"><position x="0" y="0"/><content>${'x'.repeat(1_100_000)}</content></comment>`);
    expect(errorOf(big)).toBe('the file is too large: more than 1048576 bytes (the limit is 1 MB)');
  });

  it('counts bytes of UTF-8, not characters', () => {
    const xml = project(`<comment localId="9" height="1" width="1"><position x="0" y="0"/><content>${'é'.repeat(600)}</content></comment>`);
    expect(importPlcopen(xml, { maxBytes: xml.length + 100 }).ok).toBe(false);
    expect(importPlcopen(xml, { maxBytes: xml.length + 700 }).ok).toBe(true);
  });

  it('reports XML that is not well-formed with its line and column', () => {
    const broken = `<project xmlns="${NS}">\n  <types>\n  </typo>\n</project>`;
    expect(errorOf(broken)).toMatch(/^the file is not well-formed XML at line 3, column 3: .*typo/);
  });

  it('refuses a document with two root elements', () => {
    expect(errorOf(`<project xmlns="${NS}"/><project xmlns="${NS}"/>`)).toBe(
      'the file is not well-formed XML: it has 2 root elements, XML allows exactly one',
    );
  });

  it('refuses empty text and what is not text', () => {
    expect(errorOf('   ')).toBe('the file is empty');
    expect(errorOf(42)).toBe('the PLCopen file must be given as text');
  });

  it('refuses a bad maxBytes option', () => {
    expect(errorOf(project(''), -1)).toBe('maxBytes must be a positive number of bytes, got -1');
  });

  it('does not crash on elements nested very deeply', () => {
    const deep = `<project xmlns="${NS}">${'<a>'.repeat(20_000)}${'</a>'.repeat(20_000)}</project>`;
    expect(errorOf(deep)).toBe('the file could not be read: its elements nest more than 100 levels deep');
  });
});

describe('refusing files that are not a PLCopen program with an LD body', () => {
  it('refuses another root element', () => {
    expect(errorOf('<plc/>')).toBe('the root element is <plc>, not a PLCopen <project>: this is not a PLCopen TC6 XML file');
  });

  it('refuses another namespace, naming both', () => {
    expect(errorOf(project('', { namespace: 'http://www.plcopen.org/xml/tc6_0200' }))).toBe(
      `the project has namespace "http://www.plcopen.org/xml/tc6_0200"; Rungwright reads PLCopen TC6 XML 2.01 (namespace "${NS}")`,
    );
    expect(errorOf('<project/>')).toMatch(/^the project has no namespace;/);
  });

  it('reads a project whose namespace is bound to a prefix', () => {
    const prefixed = `<ppx:project xmlns:ppx="${NS}"><ppx:types><ppx:pous><ppx:pou name="P" pouType="program"><ppx:body><ppx:LD/></ppx:body></ppx:pou></ppx:pous></ppx:types></ppx:project>`;
    expect(importPlcopen(prefixed).ok).toBe(true);
  });

  it('refuses a project with no POU, or no program POU, or a program with no body', () => {
    expect(errorOf(project('', { pou: '' }))).toBe('the project has no POU (types/pous/pou): there is no program to read');
    expect(errorOf(project('', { pou: '<pou name="F" pouType="functionBlock"/>' }))).toBe(
      'the project has no program POU (pouType="program"); it has pou "F" (pouType functionBlock)',
    );
    expect(errorOf(project('', { pou: '<pou name="P" pouType="program"/>' }))).toBe('pou "P" (pouType program) has no body: there are no rungs to read');
  });

  it('refuses an SFC body', () => {
    expect(errorOf(project('', { pou: '<pou name="P" pouType="program"><body><SFC/></body></pou>' }))).toBe(
      'pou "P" (pouType program) has an SFC body; Rungwright reads only LD (ladder diagram) bodies',
    );
  });
});

describe('refusing LD elements a Rungwright rung cannot hold, naming the element and its localId', () => {
  const cases: Array<[string, string, string]> = [
    ['label', '<label localId="7" label="x"><position x="0" y="0"/></label>', 'label (localId 7) is not supported: Rungwright rungs have no labels or jumps'],
    ['return', `<return localId="8"><position x="0" y="0"/><connectionPointIn>${from(1)}</connectionPointIn></return>`, 'return (localId 8) is not supported: a Rungwright program runs every rung on every scan, so it has no early return'],
    ['connector', '<connector localId="9" name="c"><position x="0" y="0"/></connector>', 'connector (localId 9) is not supported: draw the wire itself instead of a connector and continuation'],
    ['continuation', '<continuation localId="10" name="c"><position x="0" y="0"/></continuation>', 'continuation (localId 10) is not supported: draw the wire itself instead of a connector and continuation'],
    ['outVariable', '<outVariable localId="11"><position x="0" y="0"/><expression>%QX1</expression></outVariable>', 'outVariable (localId 11) is not supported: use a coil to write a bit; block outputs are read as operands such as T1.ET'],
    ['vendorElement', '<vendorElement localId="14"><position x="0" y="0"/></vendorElement>', 'vendorElement (localId 14) is not supported: it is specific to the tool that wrote the file'],
    ['an unknown element', '<widget localId="15"/>', 'widget (localId 15) is not supported: it is not an element of an IEC 61131-3 ladder diagram that Rungwright knows'],
  ];
  for (const [name, element, message] of cases) {
    it(`refuses ${name}`, () => {
      expect(errorOf(project(rail + element))).toBe(message);
    });
  }

  it('refuses an element without a localId, and a localId that is not a number', () => {
    expect(errorOf(project(rail + '<contact><variable>x</variable></contact>'))).toBe(
      'contact (element 2 of the LD body) has no localId; every element needs one',
    );
    expect(errorOf(project(rail + '<coil localId="k1"/>'))).toBe('coil (element 2 of the LD body) has localId "k1", which is not a whole number');
  });

  it('refuses two elements with one localId', () => {
    expect(errorOf(project(rail + contact(1, from(1))))).toBe(
      'contact (localId 1) has the same localId as leftPowerRail (localId 1); every localId must be unique',
    );
  });

  it('refuses a connection to a localId that is not there', () => {
    expect(errorOf(project(rail + contact(2, from(99))))).toBe('contact (localId 2) is connected to localId 99, which is not in the LD body');
  });

  it('refuses a connection with no refLocalId', () => {
    expect(errorOf(project(rail + contact(2, '<connection/>')))).toBe('contact (localId 2) has a connection whose refLocalId is missing');
  });

  it('refuses an element whose input is wired to nothing', () => {
    expect(errorOf(project(rail + contact(2, '')))).toBe(
      'contact (localId 2) has nothing connected to its input: every element of a rung must be wired from the left rail',
    );
  });

  it('refuses connections that run in a loop', () => {
    expect(errorOf(project(rail + contact(2, from(1, 3)) + contact(3, from(2))))).toBe(
      'the connections form a loop through contact (localId 2): power in a rung flows left to right only',
    );
  });

  it('refuses power taken from the right rail', () => {
    const right = `<rightPowerRail localId="5"><position x="0" y="0"/><connectionPointIn>${from(1)}</connectionPointIn></rightPowerRail>`;
    expect(errorOf(project(rail + right + contact(2, from(5))))).toBe(
      'contact (localId 2) is connected to rightPowerRail (localId 5), which has no output: power flows from the left rail to the right rail',
    );
  });

  it('refuses contact and coil modifiers Rungwright has no element for', () => {
    expect(errorOf(project(rail + contact(2, from(1), '%IX1', 'negated="true" edge="rising"')))).toBe(
      'contact (localId 2) is both negated and edge="rising", which is not supported: Rungwright has NO, NC, rising-edge and falling-edge contacts',
    );
    expect(errorOf(project(rail + coil(2, from(1), '%QX1', 'edge="falling" storage="set"')))).toBe(
      'coil (localId 2) is both edge="falling" and storage="set", which is not supported: Rungwright has coil, negated coil, set coil, reset coil and the positive and negative transition-sensing coils',
    );
    expect(errorOf(project(rail + coil(2, from(1), '%QX1', 'negated="true" storage="set"')))).toMatch(/^coil \(localId 2\) is both negated and storage="set"/);
    expect(errorOf(project(rail + contact(2, from(1), '%IX1', 'edge="sideways"')))).toBe(
      'contact (localId 2) has edge="sideways"; it must be one of none, rising, falling',
    );
  });

  const block = (pins: string, typeName = 'TON', outputs = '<variable formalParameter="Q"><connectionPointOut/></variable>'): string =>
    `<block localId="4" typeName="${typeName}" instanceName="T1"><position x="0" y="0"/><inputVariables>${pins}</inputVariables><inOutVariables/><outputVariables>${outputs}</outputVariables></block>`;
  const pin = (name: string, ...ids: number[]): string => `<variable formalParameter="${name}"><connectionPointIn>${from(...ids)}</connectionPointIn></variable>`;
  const inVariable = (id: number, expression: string): string =>
    `<inVariable localId="${id}"><position x="0" y="0"/><connectionPointOut/><expression>${expression}</expression></inVariable>`;

  it('refuses a block type that is not one of the standard blocks Rungwright has', () => {
    expect(errorOf(project(rail + block(pin('IN1', 1), 'ADD')))).toBe(
      'block "ADD" (localId 4) is not supported: Rungwright has the standard blocks TON, TOF, TP, CTU, CTD, CTUD, R_TRIG, F_TRIG, SR, RS',
    );
  });

  it('refuses a formal parameter the block does not have', () => {
    expect(errorOf(project(rail + block(pin('IN', 1) + pin('PRESET', 1))))).toBe(
      'block TON "T1" (localId 4) has no input "PRESET": TON has inputs IN, PT',
    );
  });

  it('refuses an operand input wired from a contact', () => {
    expect(errorOf(project(rail + contact(2, from(1)) + block(pin('IN', 1) + pin('PT', 2))))).toBe(
      "input PT of block TON \"T1\" (localId 4) is wired from contact (localId 2); Rungwright gives a block's inputs other than its power flow as operands (an address, a tag or a constant) in an inVariable",
    );
  });

  it('refuses an operand input with two connections', () => {
    expect(errorOf(project(rail + inVariable(2, 'T#1s') + inVariable(3, 'T#2s') + block(pin('IN', 1) + pin('PT', 2, 3))))).toBe(
      'input PT of block TON "T1" (localId 4) has 2 connections; an operand input takes one',
    );
  });

  it('refuses a rung carried on from a block output other than its power-flow output', () => {
    const outputs = '<variable formalParameter="Q"><connectionPointOut/></variable><variable formalParameter="ET"><connectionPointOut/></variable>';
    const fromEt = '<connection refLocalId="4" formalParameter="ET"/>';
    expect(errorOf(project(rail + inVariable(2, 'T#1s') + block(pin('IN', 1) + pin('PT', 2), 'TON', outputs) + coil(6, fromEt)))).toBe(
      'coil (localId 6) is connected to output ET of block TON "T1" (localId 4): only Q carries a rung on; read ET elsewhere as the operand T1.ET',
    );
  });

  it('refuses power flow taken from an inVariable', () => {
    expect(errorOf(project(inVariable(2, 'TRUE') + coil(3, from(2))))).toBe(
      'coil (localId 3) takes power flow from inVariable (localId 2): in Rungwright power comes from the left rail through contacts; a variable feeds only a block\'s operand inputs',
    );
  });

  it('refuses a negated block pin', () => {
    const negatedPin = `<variable formalParameter="IN" negated="true"><connectionPointIn>${from(1)}</connectionPointIn></variable>`;
    expect(errorOf(project(rail + block(negatedPin)))).toBe(
      'block TON "T1" (localId 4): negated="true" on input IN is not supported; put a contact or coil with that modifier in the rung instead',
    );
  });

  it('refuses a tag name that Rungwright cannot hold', () => {
    const vars = '<localVars><variable name="a_very_long_name_that_goes_past_thirty_two" address="%IX1"><type><BOOL/></type></variable></localVars>';
    expect(errorOf(project('', { interface: vars }))).toBe(
      'variable "a_very_long_name_that_goes_past_thirty_two" (address %IX1) cannot become a tag: a tag name is at most 32 characters',
    );
  });
});
