package dev.circa.validator.rules;

import dev.circa.engine.CompileException;
import dev.circa.engine.CompiledCircuit;
import dev.circa.engine.Evaluator;
import dev.circa.format.CheckCase;
import dev.circa.format.Checks;
import dev.circa.validator.Severity;
import java.util.List;
import dev.circa.validator.analysis.Numbers;
import java.util.Locale;

/**
 * An embedded check case whose log-density the circuit does not reproduce within the file's
 * tolerances (FORMAT.md, checks). Cases are evaluated with the engine, only when the references and
 * parameters are valid (otherwise other rules have already said why).
 */
@RuleInfo(id = "CheckCaseFailed", summary = "An embedded check case does not reproduce its log-density",
        severity = Severity.ERROR, guards = Aspect.CHECKS)
public final class CheckCaseFailed extends Rule {
    @Override
    public void check(RuleContext ctx) {
        Checks checks = ctx.document().checks();
        if (checks == null || checks.cases().isEmpty() || !ctx.graph().usable() || ctx.parameters().anyProblem()
                || !ctx.graph().familyTypes.isEmpty() || !ctx.graph().repeatedVars.isEmpty()) {
            return;
        }
        CompiledCircuit c;
        try {
            c = CompiledCircuit.compile(ctx.document());
        } catch (CompileException e) {
            ctx.at(this, severity(), "/checks", "the checks cannot be evaluated: " + e.getMessage());
            return;
        }
        Evaluator ev = new Evaluator(c);
        List<CheckCase> cases = checks.cases();
        double[] row = new double[c.variableCount()];
        double[] out = new double[c.outputCount()];
        for (int k = 0; k < cases.size(); k++) {
            CheckCase cc = cases.get(k);
            int o = CheckRows.output(ctx.document(), cc);
            if (o < 0 || CheckRows.fill(ctx.document(), cc, row) != null) {
                continue;
            }
            ev.logDensity(row, 1, out);
            double got = out[o];
            double want = cc.logDensity();
            boolean pass = want == Double.NEGATIVE_INFINITY ? got == Double.NEGATIVE_INFINITY
                    : Math.abs(got - want) <= checks.atol() + checks.rtol() * Math.abs(want);
            if (!pass && !ctx.skip(this, severity())) {
                ctx.at(this, severity(), "/checks/cases/" + k, String.format(Locale.ROOT,
                        "check case %d of output \"%s\" computes log-density %s; expected %s within %s + %s * |expected| "
                                + "(the file's checks.atol and checks.rtol), off by %s",
                        k, c.outputName(o), Numbers.text(got), Numbers.text(want), Numbers.text(checks.atol()),
                        Numbers.text(checks.rtol()), Numbers.text(Math.abs(got - want))));
            }
        }
    }
}
