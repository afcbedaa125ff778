import { describe, expect, it } from 'vitest';
import { programName, programToStructuredText } from '@shared/ladder/st';
import { block, coil, nc, no, parallel, program, rising, rung, series, tag } from './fixtures';

describe('programToStructuredText', () => {
  it('renders the demo conveyor program as one PROGRAM with declarations and one statement group per rung', () => {
    const doc = program(
      [
        { ...rung('r1', no('c1', 'S1'), parallel('p1', no('c2', 'S2'), no('c3', 'K1')), coil('k1', 'K1')), comment: 'three-wire forward start' },
        rung('r2', no('c4', 'K1'), block('b1', 'TON', 'T1', { PT: 't#3S' }), coil('k2', 'H1')),
        rung('r3', no('c5', 'S1'), coil('k3', 'K2', 'set')),
        rung('r4', nc('c6', 'S1'), coil('k4', 'K2', 'reset')),
        rung('r5', no('c7', 'S2'), no('c8', 'B1'), coil('k5', 'P1'), coil('k6', '%MX1', 'negated')),
        rung('r6', rising('c9', 'B1'), block('b2', 'CTU', 'C1', { PV: '3', R: 'S1' })),
        rung('r7'),
      ],
      [tag('S1', '%IX1', 'stop, NC'), tag('S2', '%IX2', 'forward'), tag('B1', '%IX5'), tag('K1', '%QX1'), tag('K2', '%QX2'), tag('H1', '%QX3'), tag('P1', '%QX4', 'green (*lamp*)')],
    );
    expect(programToStructuredText(doc)).toBe(
      [
        '(* Demo: Larch Hollow conveyor: Structured Text rendered by Rungwright for reading; the ladder is the source. *)',
        'PROGRAM Demo_Larch_Hollow_conveyor',
        'VAR',
        '    S1 AT %IX1 : BOOL; (* stop, NC *)',
        '    S2 AT %IX2 : BOOL; (* forward *)',
        '    B1 AT %IX5 : BOOL;',
        '    K1 AT %QX1 : BOOL;',
        '    K2 AT %QX2 : BOOL;',
        '    H1 AT %QX3 : BOOL;',
        '    P1 AT %QX4 : BOOL; (* green ( *lamp* ) *)',
        '    T1 : TON;',
        '    C1 : CTU;',
        '    Rung5_Flow : BOOL; (* power flow of rung 5 *)',
        '    Rung6_Edge1 : R_TRIG; (* rising edge of B1 in rung 6 *)',
        'END_VAR',
        '',
        '(* Rung 1: three-wire forward start *)',
        'K1 := (S1 AND (S2 OR K1));',
        '',
        '(* Rung 2 *)',
        'T1(IN := K1, PT := T#3s);',
        'H1 := T1.Q;',
        '',
        '(* Rung 3 *)',
        'IF S1 THEN K2 := TRUE; END_IF;',
        '',
        '(* Rung 4 *)',
        'IF NOT S1 THEN K2 := FALSE; END_IF;',
        '',
        '(* Rung 5 *)',
        'Rung5_Flow := S2 AND B1;',
        'P1 := Rung5_Flow;',
        '%MX1 := NOT Rung5_Flow;',
        '',
        '(* Rung 6 *)',
        'Rung6_Edge1(CLK := B1);',
        'C1(CU := Rung6_Edge1.Q, R := S1, PV := 3);',
        '',
        '(* Rung 7 (empty) *)',
        '',
        'END_PROGRAM',
        '',
      ].join('\n'),
    );
  });

  it('feeds a final branch from the shared flow and calls a block in a branch before using its output', () => {
    const doc = program(
      [
        rung('r1', no('a', 'S1'), parallel('p', coil('k1', 'K1'), series('s', no('b', 'S2'), coil('k2', 'P1')))),
        rung('r2', parallel('p2', series('s2', no('c', 'S2'), block('t', 'TOF', 'T2', { PT: 'T#2s' })), no('d', 'S3')), coil('k3', 'H1')),
      ],
      [tag('S1', '%IX1'), tag('S2', '%IX2'), tag('S3', '%IX3'), tag('K1', '%QX1'), tag('P1', '%QX4'), tag('H1', '%QX3')],
    );
    const text = programToStructuredText(doc);
    expect(text).toContain('(* Rung 1 *)\nK1 := S1;\nP1 := (S1 AND S2);\n');
    expect(text).toContain('(* Rung 2 *)\nT2(IN := S2, PT := T#2s);\nH1 := (T2.Q OR S3);\n');
  });

  it('writes direct addresses where no tag exists, and omits VAR when nothing is declared', () => {
    const text = programToStructuredText({ ...program([rung('r1', no('a', '%ix2'), coil('k', '%QX1'))]), title: '2nd lab!' });
    expect(text).toBe(
      '(* 2nd lab!: Structured Text rendered by Rungwright for reading; the ladder is the source. *)\nPROGRAM P_2nd_lab\n\n(* Rung 1 *)\n%QX1 := %IX2;\n\nEND_PROGRAM\n',
    );
  });
});

describe('programName', () => {
  it('makes an IEC identifier from any title', () => {
    expect(programName('Demo: Larch Hollow conveyor')).toBe('Demo_Larch_Hollow_conveyor');
    expect(programName('***')).toBe('Main');
    expect(programName('Försök 3')).toBe('Forsok_3');
  });
});
