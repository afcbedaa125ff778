/**
 * IEC 61131-3 Structured Text rendering of a whole program (clause 7.3 [memory]), read-only, for
 * learning: what the ladder means as statements. `PROGRAM <Name>`, a `VAR` block declaring the
 * tags as located variables (`S1 AT %IX1 : BOOL;`) and the block instances (`T1 : TON;`), then per
 * rung an assignment (`K1 := (S1 AND (S2 OR K1));`), an `IF … THEN … END_IF;` for set/reset coils,
 * or a block call (`T1(IN := S2, PT := T#3s);`) followed by the coils it feeds from `T1.Q`.
 *
 * ST has no edge contact, so a rising/falling contact becomes an R_TRIG/F_TRIG instance of its
 * own, called before the rung. When one rung drives several outputs, its power flow is stored in a
 * BOOL first, so every output sees the value from before any of them was written, as in the
 * ladder. A program with errors renders what it can; validation is the place for the errors.
 */
import { BLOCK_SPECS } from './blocks';
import { flowThroughItems, isCompound, printExpr, splitOutputs, term, TRUE_EXPR, type Expr, type FlowStyle } from './flow';
import { createNameView, type NameView } from './names';
import { symbolKey } from './operands';
import type { Coil, NetworkNode, Program, Series } from './schema';
import { blockCallText } from './text';
import { formatTime, looksLikeTimeLiteral, parseTimeLiteral } from './time';
import { parseAddress, formatAddress } from './addresses';

const INDENT = '    ';

/** Text safe inside `(* … *)`: no comment delimiters, one line. */
function commentText(text: string): string {
  return text.replace(/\s+/g, ' ').replaceAll('(*', '( *').replaceAll('*)', '* )').trim();
}

/** A valid IEC identifier from the title: `Demo: Larch Hollow conveyor` → `Demo_Larch_Hollow_conveyor`. */
export function programName(title: string): string {
  const name = title
    .normalize('NFKD')
    .replace(/[\u0300-\u036f]/g, '')
    .replace(/[^A-Za-z0-9]+/g, '_')
    .replace(/^_+|_+$/g, '')
    .slice(0, 32)
    .replace(/_+$/g, '');
  if (name === '') return 'Main';
  return /^[0-9]/.test(name) ? `P_${name}` : name;
}

interface Declaration {
  name: string;
  type: string;
  comment: string;
}

interface RungContext {
  rungNumber: number;
  statements: string[];
  declarations: Declaration[];
  taken: Set<string>;
  names: NameView;
}

/** A helper variable name no tag or instance uses. */
function helperName(base: string, ctx: RungContext): string {
  let name = base;
  let n = 2;
  while (ctx.taken.has(symbolKey(name))) name = `${base}${n++}`;
  ctx.taken.add(symbolKey(name));
  return name;
}

function operandText(text: string, names: NameView): string {
  const source = text.trim();
  if (looksLikeTimeLiteral(source)) {
    const ms = parseTimeLiteral(source);
    if (ms.ok) return formatTime(ms.value);
  }
  return names.display(source);
}

function rhs(flow: Expr): string {
  return isCompound(flow) ? `(${printExpr(flow)})` : printExpr(flow);
}

function coilStatement(coil: Coil, flow: Expr, ctx: RungContext): string {
  const target = ctx.names.display(coil.operand);
  switch (coil.variant) {
    case 'coil':
      return `${target} := ${rhs(flow)};`;
    case 'negated':
      return `${target} := NOT ${rhs(flow)};`;
    case 'set':
      return `IF ${printExpr(flow)} THEN ${target} := TRUE; END_IF;`;
    case 'reset':
      return `IF ${printExpr(flow)} THEN ${target} := FALSE; END_IF;`;
    case 'positive':
    case 'negative': {
      // A transition-sensing coil is the edge of its power flow: an R_TRIG (F_TRIG) on it.
      const type = coil.variant === 'positive' ? 'R_TRIG' : 'F_TRIG';
      const name = helperName(`Rung${ctx.rungNumber}_${coil.variant === 'positive' ? 'Rise' : 'Fall'}`, ctx);
      ctx.declarations.push({ name, type, comment: `${coil.variant} transition-sensing coil ${target} in rung ${ctx.rungNumber}` });
      ctx.statements.push(`${name}(CLK := ${printExpr(flow)});`);
      return `${target} := ${name}.Q;`;
    }
  }
}

function styleFor(ctx: RungContext): FlowStyle {
  let edges = 0;
  return {
    contact(contact) {
      const operand = ctx.names.display(contact.operand);
      if (contact.variant === 'no') return term(operand);
      if (contact.variant === 'nc') return term(`NOT ${operand}`);
      edges += 1;
      const type = contact.variant === 'rising' ? 'R_TRIG' : 'F_TRIG';
      const name = helperName(`Rung${ctx.rungNumber}_Edge${edges}`, ctx);
      ctx.declarations.push({ name, type, comment: `${contact.variant} edge of ${operand} in rung ${ctx.rungNumber}` });
      ctx.statements.push(`${name}(CLK := ${operand});`);
      return term(`${name}.Q`);
    },
    block(block, input) {
      const call = blockCallText(block, printExpr(input), (t) => operandText(t, ctx.names));
      // blockCallText prints `TON T1(...)`; a call statement is the instance name and its arguments.
      ctx.statements.push(`${call.slice(block.type.length + 1)};`);
      return term(`${ctx.names.display(block.instance)}.${BLOCK_SPECS[block.type].powerOut}`);
    },
    midCoil(coil, input) {
      ctx.statements.push(coilStatement(coil, input, ctx));
    },
  };
}

function countOutputs(outputs: readonly NetworkNode[]): number {
  return outputs.reduce((n, o) => n + (o.kind === 'parallel' ? o.branches.length : 1), 0);
}

function emitSeries(items: readonly NetworkNode[], input: Expr, ctx: RungContext, style: FlowStyle): void {
  const series: Series = { kind: 'series', id: '', items: [...items] };
  const { body, outputs } = splitOutputs(series);
  let flow = flowThroughItems(body, input, style);
  if (countOutputs(outputs) > 1 && isCompound(flow)) {
    const name = helperName(`Rung${ctx.rungNumber}_Flow`, ctx);
    ctx.declarations.push({ name, type: 'BOOL', comment: `power flow of rung ${ctx.rungNumber}` });
    ctx.statements.push(`${name} := ${printExpr(flow)};`);
    flow = term(name);
  }
  for (const output of outputs) {
    if (output.kind === 'coil') ctx.statements.push(coilStatement(output, flow, ctx));
    else if (output.kind === 'parallel') {
      for (const branch of output.branches) {
        emitSeries(branch.kind === 'series' ? branch.items : [branch], flow, ctx, style);
      }
    } else emitSeries([output], flow, ctx, style);
  }
}

function declarationLine(d: Declaration): string {
  return `${INDENT}${d.name} : ${d.type};${d.comment ? ` (* ${commentText(d.comment)} *)` : ''}`;
}

/** The whole program as Structured Text. */
export function programToStructuredText(program: Program): string {
  const names = createNameView(program);
  const taken = new Set<string>([...names.symbols.spellings.keys()]);
  const declarations: string[] = [];
  /** Tags marked retain, declared in a `VAR RETAIN` block of their own (IEC 61131-3). */
  const retained: string[] = [];
  for (const tag of program.tags) {
    const address = parseAddress(tag.address);
    const comment = tag.comment.trim() ? ` (* ${commentText(tag.comment)} *)` : '';
    if (address.ok && tag.retain === true) retained.push(`${INDENT}${tag.name} AT ${formatAddress(address.value)} : BOOL;${comment}`);
    else if (address.ok) declarations.push(`${INDENT}${tag.name} AT ${formatAddress(address.value)} : BOOL;${comment}`);
    else declarations.push(`${INDENT}(* tag ${commentText(tag.name)} has no usable address: ${commentText(tag.address)} *)`);
  }
  for (const [key, type] of names.symbols.instances) {
    declarations.push(`${INDENT}${names.symbols.spellings.get(key) ?? key} : ${type};`);
  }

  const body: string[] = [];
  program.rungs.forEach((rung, index) => {
    const ctx: RungContext = { rungNumber: index + 1, statements: [], declarations: [], taken, names };
    const heading = rung.comment.trim() ? `Rung ${ctx.rungNumber}: ${commentText(rung.comment)}` : `Rung ${ctx.rungNumber}`;
    if (rung.network.items.length === 0) {
      body.push(`(* ${heading} (empty) *)`, '');
      return;
    }
    emitSeries(rung.network.items, TRUE_EXPR, ctx, styleFor(ctx));
    declarations.push(...ctx.declarations.map(declarationLine));
    body.push(`(* ${heading} *)`, ...(ctx.statements.length > 0 ? ctx.statements : ['(* drives no output *)']), '');
  });

  const lines = [
    `(* ${commentText(program.title)}: Structured Text rendered by Rungwright for reading; the ladder is the source. *)`,
    `PROGRAM ${programName(program.title)}`,
  ];
  if (declarations.length > 0) lines.push('VAR', ...declarations, 'END_VAR');
  if (retained.length > 0) lines.push('VAR RETAIN', ...retained, 'END_VAR');
  lines.push('', ...body, 'END_PROGRAM', '');
  return lines.join('\n');
}
