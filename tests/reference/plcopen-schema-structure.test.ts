/**
 * The structure "PLCopen TC6 XML Formats for IEC 61131-3, Version 2.01" (schema tc6_xml_v201.xsd)
 * requires of an exported file, checked element by element (docs/published-values.md, PLCopen section). The
 * schema itself carries no open licence and cannot be fetched here, so it is not used; the file is
 * read with fast-xml-parser's own validator and parser, independently of Rungwright's reader. The
 * order of children inside each xsd:sequence is from memory of the schema.
 */
import { XMLParser, XMLValidator } from 'fast-xml-parser';
import { describe, expect, it } from 'vitest';
import { BLOCK_SPECS } from '@shared/ladder/blocks';
import { exportPlcopen } from '@shared/ladder/plcopen';
import type { BlockType, Program } from '@shared/ladder/schema';
import { createBuilders, program } from '../unit/plcopen/programs';

interface Node {
  name: string;
  attrs: Record<string, string>;
  children: Node[];
  text: string;
}

function parse(xml: string): Node {
  const raw = new XMLParser({ preserveOrder: true, ignoreAttributes: false, attributeNamePrefix: '', parseTagValue: false, trimValues: false }).parse(xml) as unknown[];
  const convert = (entry: Record<string, unknown>): Node | null => {
    const name = Object.keys(entry).find((k) => k !== ':@');
    if (name === undefined || name.startsWith('?') || name === '#text') return null;
    const kids = (entry[name] as Array<Record<string, unknown>>) ?? [];
    return {
      name,
      attrs: (entry[':@'] as Record<string, string>) ?? {},
      children: kids.map(convert).filter((n): n is Node => n !== null),
      text: kids.filter((k) => '#text' in k).map((k) => String(k['#text'])).join(''),
    };
  };
  const roots = (raw as Array<Record<string, unknown>>).map(convert).filter((n): n is Node => n !== null);
  expect(roots).toHaveLength(1);
  return roots[0]!;
}

const kids = (node: Node, name: string): Node[] => node.children.filter((c) => c.name === name);
function only(node: Node, name: string): Node {
  const found = kids(node, name);
  expect(found, `<${node.name}> has exactly one <${name}>`).toHaveLength(1);
  return found[0]!;
}
const names = (node: Node): string[] => node.children.map((c) => c.name);

/** Demo data (invented): a rung of every kind the exporter writes. */
function sample(): Program {
  const b = createBuilders();
  return program(
    [
      b.rung('Seal-in\nwith two lines', b.nc('%IX6'), b.no('Stop'), b.parallel(b.no('%IX2'), b.no('%QX1')), b.coil('%QX1')),
      b.rung('', b.contact('rising', '%IX5'), b.block('CTU', 'C1', { R: '%IX4', PV: '3' }), b.parallel(b.coil('%QX2', 'set'), b.coil('%MX3', 'reset'))),
      b.rung('', b.no('%QX1'), b.block('TON', 'T1', { PT: 'T#2s' }), b.block('R_TRIG', 'E1'), b.coil('%QX3', 'negated')),
      b.rung(''),
      b.rung('', b.contact('falling', '%IX3'), b.block('CTUD', 'C2', { CD: '%IX7', PV: '5' })),
    ],
    [{ name: 'Stop', address: '%IX1', comment: 'S1 stop, NC' }],
    'Structure sample (demo)',
    'Invented demo data.',
  );
}

const xml = exportPlcopen(sample(), { now: '2025-06-01T12:00:00Z' });
const project = parse(xml);
const pou = only(only(only(project, 'types'), 'pous'), 'pou');
const ld = only(only(pou, 'body'), 'LD');

describe('PLCopen TC6 XML 2.01 document structure of an export (tc6_xml_v201.xsd)', () => {
  it('is well-formed XML by fast-xml-parser\'s validator', () => {
    expect(XMLValidator.validate(xml)).toBe(true);
  });

  it('has a project root in namespace http://www.plcopen.org/xml/tc6_0201 with the children in schema order', () => {
    expect(project.name).toBe('project');
    expect(project.attrs.xmlns).toBe('http://www.plcopen.org/xml/tc6_0201');
    expect(names(project)).toEqual(['fileHeader', 'contentHeader', 'types', 'instances']);
  });

  it('has a fileHeader with the required companyName, productName, productVersion and an xsd:dateTime creationDateTime', () => {
    const header = only(project, 'fileHeader');
    for (const required of ['companyName', 'productName', 'productVersion', 'creationDateTime']) {
      expect(header.attrs[required], required).toBeTruthy();
    }
    expect(header.attrs.productName).toBe('Rungwright');
    expect(header.attrs.creationDateTime).toBe('2025-06-01T12:00:00Z');
    expect(header.attrs.creationDateTime).toMatch(/^\d{4}-\d{2}-\d{2}T\d{2}:\d{2}:\d{2}(\.\d+)?(Z|[+-]\d{2}:\d{2})?$/);
  });

  it('has a contentHeader with a name and a coordinateInfo holding fbd, ld and sfc scaling', () => {
    const header = only(project, 'contentHeader');
    expect(header.attrs.name).toBe('Structure sample (demo)');
    expect(names(header)).toEqual(['Comment', 'coordinateInfo']);
    const info = only(header, 'coordinateInfo');
    expect(names(info)).toEqual(['fbd', 'ld', 'sfc']);
    for (const language of info.children) {
      const scaling = only(language, 'scaling');
      expect(Number(scaling.attrs.x)).toBeGreaterThan(0);
      expect(Number(scaling.attrs.y)).toBeGreaterThan(0);
    }
  });

  it('has types with dataTypes then pous, and one program pou with an interface and an LD body', () => {
    expect(names(only(project, 'types'))).toEqual(['dataTypes', 'pous']);
    expect(pou.attrs.name).toMatch(/^[A-Za-z_][A-Za-z0-9_]*$/);
    expect(pou.attrs.pouType).toBe('program');
    expect(names(pou)).toEqual(['interface', 'body']);
  });

  it('declares tags as BOOL variables with an address, block instances as derived types, untagged memory bits too', () => {
    const variables = kids(only(only(pou, 'interface'), 'localVars'), 'variable');
    const byName = new Map(variables.map((v) => [v.attrs.name, v]));
    expect(byName.get('Stop')?.attrs.address).toBe('%IX1');
    expect(names(only(byName.get('Stop')!, 'type'))).toEqual(['BOOL']);
    for (const [instance, type] of [['C1', 'CTU'], ['T1', 'TON'], ['E1', 'R_TRIG'], ['C2', 'CTUD']]) {
      const derived = only(only(byName.get(instance)!, 'type'), 'derived');
      expect(derived.attrs.name).toBe(type);
    }
    const memory = variables.find((v) => v.attrs.address === '%MX3');
    expect(memory && names(only(memory, 'type'))).toEqual(['BOOL']);
    for (const variable of variables) {
      expect(variable.children[0]?.name, `variable ${variable.attrs.name} starts with its type`).toBe('type');
    }
  });

  it('has instances with configurations, as the schema requires', () => {
    const configurations = only(only(project, 'instances'), 'configurations');
    const resource = only(only(configurations, 'configuration'), 'resource');
    const task = only(resource, 'task');
    expect(task.attrs.priority).toBeDefined();
    expect(only(task, 'pouInstance').attrs.typeName).toBe(pou.attrs.name);
  });

  it('gives every LD element a unique whole-number localId and a position', () => {
    const ids = ld.children.map((e) => e.attrs.localId);
    for (const [index, element] of ld.children.entries()) {
      expect(element.attrs.localId, `${element.name} #${index}`).toMatch(/^\d+$/);
      const position = only(element, 'position');
      expect(Number.isFinite(Number(position.attrs.x)) && Number.isFinite(Number(position.attrs.y))).toBe(true);
      expect(element.children[0]?.name, `${element.name} starts with its position`).toBe('position');
    }
    expect(new Set(ids).size).toBe(ids.length);
  });

  it('points every connection at an element of the body, naming the output pin when the source is a block', () => {
    const byId = new Map(ld.children.map((e) => [e.attrs.localId, e]));
    const connections: Node[] = [];
    const collect = (node: Node): void => {
      if (node.name === 'connection') connections.push(node);
      node.children.forEach(collect);
    };
    ld.children.forEach(collect);
    expect(connections.length).toBeGreaterThan(10);
    for (const connection of connections) {
      const source = byId.get(connection.attrs.refLocalId);
      expect(source, `refLocalId ${connection.attrs.refLocalId}`).toBeDefined();
      expect(source?.name).not.toBe('rightPowerRail');
      if (source?.name === 'block') {
        const outputs = BLOCK_SPECS[source.attrs.typeName as BlockType].outputs.map((p) => p.name);
        expect(outputs).toContain(connection.attrs.formalParameter);
      }
    }
  });

  it('writes contacts and coils with position, connectionPointIn, connectionPointOut, variable, and schema attribute values', () => {
    const elements = ld.children.filter((e) => e.name === 'contact' || e.name === 'coil');
    expect(elements.length).toBe(11);
    for (const element of elements) {
      expect(names(element).slice(0, 4)).toEqual(['position', 'connectionPointIn', 'connectionPointOut', 'variable']);
      expect(['true', 'false']).toContain(element.attrs.negated);
      // TC6 gives both a contact and a coil `edge` (none|rising|falling); a coil also `storage`.
      expect(['none', 'rising', 'falling']).toContain(element.attrs.edge);
      if (element.name === 'coil') expect(['none', 'set', 'reset']).toContain(element.attrs.storage);
    }
    const variants = elements.map((e) => `${e.name}:${e.attrs.negated}:${e.attrs.storage !== undefined && e.attrs.storage !== 'none' ? e.attrs.storage : e.attrs.edge}`);
    expect(variants).toContain('contact:true:none');
    expect(variants).toContain('contact:false:rising');
    expect(variants).toContain('contact:false:falling');
    expect(variants).toContain('coil:true:none');
    expect(variants).toContain('coil:false:set');
    expect(variants).toContain('coil:false:reset');
  });

  it('writes blocks with typeName, instanceName and every formal parameter in inputVariables and outputVariables', () => {
    const blocks = ld.children.filter((e) => e.name === 'block');
    expect(blocks.map((b) => b.attrs.typeName)).toEqual(['CTU', 'TON', 'R_TRIG', 'CTUD']);
    for (const block of blocks) {
      const spec = BLOCK_SPECS[block.attrs.typeName as BlockType];
      expect(block.attrs.instanceName).toBeTruthy();
      expect(names(block).slice(0, 4)).toEqual(['position', 'inputVariables', 'inOutVariables', 'outputVariables']);
      expect(kids(only(block, 'inputVariables'), 'variable').map((v) => v.attrs.formalParameter)).toEqual(spec.inputs.map((p) => p.name));
      expect(kids(only(block, 'outputVariables'), 'variable').map((v) => v.attrs.formalParameter)).toEqual(spec.outputs.map((p) => p.name));
    }
  });

  it('feeds constants through inVariables with an expression', () => {
    const expressions = ld.children.filter((e) => e.name === 'inVariable').map((v) => only(v, 'expression').text);
    expect(expressions).toEqual(['%IX4', '3', 'T#2s', '%IX7', '5']);
  });

  it('gives each rung a leftPowerRail whose connectionPointOut has a formalParameter, and a rightPowerRail', () => {
    const left = ld.children.filter((e) => e.name === 'leftPowerRail');
    const right = ld.children.filter((e) => e.name === 'rightPowerRail');
    expect(left).toHaveLength(5);
    expect(right).toHaveLength(5);
    for (const rail of left) expect(only(rail, 'connectionPointOut').attrs.formalParameter).toBeDefined();
  });

  it('writes a rung comment as a comment element with XHTML content, one paragraph a line', () => {
    const comment = only(ld, 'comment');
    expect(Number(comment.attrs.height)).toBeGreaterThan(0);
    expect(Number(comment.attrs.width)).toBeGreaterThan(0);
    const paragraphs = only(comment, 'content').children;
    expect(paragraphs.map((p) => [p.name, p.attrs['xmlns:xhtml'], p.text])).toEqual([
      ['xhtml:p', 'http://www.w3.org/1999/xhtml', 'Seal-in'],
      ['xhtml:p', 'http://www.w3.org/1999/xhtml', 'with two lines'],
    ]);
  });

  it('keeps addData as data elements with a name and handleUnknown, one element inside', () => {
    const all: Node[] = [];
    const collect = (node: Node): void => {
      if (node.name === 'addData') all.push(node);
      node.children.forEach(collect);
    };
    collect(project);
    expect(all.length).toBeGreaterThan(0);
    for (const addData of all) {
      for (const data of kids(addData, 'data')) {
        expect(data.attrs.name).toMatch(/^urn:rungwright:/);
        expect(['preserve', 'discard', 'implementation']).toContain(data.attrs.handleUnknown);
        expect(data.children).toHaveLength(1);
      }
    }
  });

  it('lays elements out left to right along the power flow, so another tool can draw the file', () => {
    const byId = new Map(ld.children.map((e) => [e.attrs.localId, e]));
    for (const element of ld.children.filter((e) => e.name === 'contact' || e.name === 'coil')) {
      const x = Number(only(element, 'position').attrs.x);
      for (const connection of kids(only(element, 'connectionPointIn'), 'connection')) {
        const source = byId.get(connection.attrs.refLocalId)!;
        expect(Number(only(source, 'position').attrs.x), `${source.name} ${source.attrs.localId} is left of ${element.attrs.localId}`).toBeLessThan(x);
      }
    }
  });
});
