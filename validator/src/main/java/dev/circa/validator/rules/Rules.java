package dev.circa.validator.rules;

import java.util.ArrayList;
import java.util.List;

/** The registry: every rule, sorted by id. */
public final class Rules {
    private static final List<Rule> ALL = List.of(
            new CategoricalLengthMismatch(),
            new CheckCaseFailed(),
            new CheckCaseInvalid(),
            new ChildMissing(),
            new ChildNotEarlier(),
            new CovarianceNotPositiveDefinite(),
            new CovarianceNotSymmetric(),
            new DuplicateNodeId(),
            new FamilyTypeMismatch(),
            new InputVariablesRepeated(),
            new NodeUnreachable(),
            new NodeWithoutChildren(),
            new NumberNotFinite(),
            new OutputNameDuplicate(),
            new OutputNodeMissing(),
            new OutputNotNormalized(),
            new OutputScopeIncomplete(),
            new OutputsMissing(),
            new ParameterOutOfRange(),
            new ProbabilitiesNotNormalized(),
            new ProductNotStructured(),
            new ProductScopesOverlap(),
            new RequiredPropertyUnknown(),
            new SchemaMismatch(),
            new SumNotDeterministic(),
            new SumScopesDiffer(),
            new UnknownProperty(),
            new VariableIndexOutOfRange(),
            new VariableNameDuplicate(),
            new VariableNameReserved(),
            new WeightCountMismatch(),
            new WeightNegative(),
            new WeightsNotNormalized());

    private Rules() {
    }

    /** Every rule, sorted by id. */
    public static List<Rule> all() {
        return ALL;
    }

    /** The rule with id {@code id}, or {@code null}. */
    public static Rule byId(String id) {
        for (Rule r : ALL) {
            if (r.id().equals(id)) {
                return r;
            }
        }
        return null;
    }

    /** Every id, sorted. */
    public static List<String> ids() {
        List<String> ids = new ArrayList<>();
        for (Rule r : ALL) {
            ids.add(r.id());
        }
        return ids;
    }
}
