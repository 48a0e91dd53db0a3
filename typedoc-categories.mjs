// TypeDoc plugin of this project: files every exported declaration under a category taken from the folder
// of its source file (network, materials, geometry, waveforms, simulation, analyses, solver, report, sweep),
// so the API reference lists the user API by topic instead of one flat list. An explicit `@category` tag wins.
import { Comment, CommentTag, Converter, ReflectionKind } from 'typedoc';

/** [path fragment, category], first match wins. */
const RULES = [
  ['/src/analysis/', 'Analyses'],
  ['/src/geometry/', 'Geometry'],
  ['/src/materials/', 'Materials'],
  ['/src/waveforms/', 'Waveforms'],
  ['/src/network/', 'Network'],
  ['/src/formulation/', 'Network'],
  ['/src/solver/', 'Solver'],
  ['/src/report/', 'Report'],
  ['/src/sweep/', 'Sweep'],
  ['/src/simulate.ts', 'Simulation'],
  ['/src/result/', 'Simulation'],
  ['/src/simulation/', 'Simulation'],
  ['/src/stepping/', 'Simulation'],
  ['/src/errors.ts', 'Errors and constants'],
  ['/src/constants.ts', 'Errors and constants'],
];

/** @param {import('typedoc').Application} app */
export function load(app) {
  app.converter.on(Converter.EVENT_CREATE_DECLARATION, (context, reflection) => {
    // Only the members of a module (the entry points), not their properties or methods.
    if (!reflection.parent || !reflection.parent.kindOf(ReflectionKind.Project | ReflectionKind.Module)) return;
    const symbol = context.getSymbolFromReflection(reflection);
    const declaration = symbol?.declarations?.[0];
    const file = declaration?.getSourceFile().fileName.replace(/\\/g, '/');
    if (!file) return;
    const rule = RULES.find(([fragment]) => file.includes(fragment));
    if (!rule) return;
    reflection.comment ??= new Comment();
    if (reflection.comment.blockTags.some((t) => t.tag === '@category')) return;
    reflection.comment.blockTags.push(new CommentTag('@category', [{ kind: 'text', text: rule[1] }]));
  });
}
