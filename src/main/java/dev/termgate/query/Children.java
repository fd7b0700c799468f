package dev.termgate.query;

import java.util.IdentityHashMap;
import java.util.List;
import java.util.Map;
import java.util.Optional;

/**
 * The child nodes of every record of the tree, written out: the analyzer walks each query several ways, and
 * reading components through a generic accessor table cost more than the checks themselves. {@link Trees} uses
 * this for {@code children} and {@code walk} and keeps the generic table for records missing here (none today;
 * {@code TreesTest} checks both give the same children on the openCypher TCK queries and that every record
 * class of the tree is listed).
 */
final class Children {
    private Children() {}

    /** Appends the direct children of a node of type {@code T}, in component order. */
    @FunctionalInterface
    interface Kids<T extends Node> {
        void add(T node, List<Node> out);
    }

    private static final Map<Class<?>, Kids<?>> TABLE = new IdentityHashMap<>();

    private static final ClassValue<Kids<Node>> BY_CLASS = new ClassValue<>() {
        @Override
        @SuppressWarnings("unchecked")
        protected Kids<Node> computeValue(Class<?> type) {
            return (Kids<Node>) TABLE.get(type);
        }
    };

    /** The written-out children of this record class, or null when it is not listed. */
    static Kids<Node> of(Class<?> type) {
        return BY_CLASS.get(type);
    }

    /** The record classes listed (for the completeness test). */
    static java.util.Set<Class<?>> listed() {
        return java.util.Collections.unmodifiableSet(TABLE.keySet());
    }

    private static <T extends Node> void put(Class<T> type, Kids<T> kids) {
        TABLE.put(type, kids);
    }

    private static void leaf(Class<? extends Node> type) {
        TABLE.put(type, (Kids<Node>) (n, out) -> { });
    }

    private static void one(List<Node> out, Node n) {
        if (n != null) out.add(n);
    }

    private static void opt(List<Node> out, Optional<? extends Node> n) {
        if (n != null && n.isPresent()) out.add(n.get());
    }

    private static void list(List<Node> out, List<? extends Node> nodes) {
        if (nodes != null) out.addAll(nodes);
    }

    static {
        put(Query.class, (Query x, List<Node> out) -> { one(out, x.first()); list(out, x.unions()); });
        put(Query.UnionPart.class, (Query.UnionPart x, List<Node> out) -> { one(out, x.query()); });
        put(SingleQuery.class, (SingleQuery x, List<Node> out) -> { list(out, x.clauses()); });
        put(Clause.Create.class, (Clause.Create x, List<Node> out) -> { one(out, x.pattern()); });
        put(Clause.Match.class, (Clause.Match x, List<Node> out) -> { one(out, x.pattern()); opt(out, x.where()); });
        put(Clause.Unwind.class, (Clause.Unwind x, List<Node> out) -> { one(out, x.list()); one(out, x.alias()); });
        put(Clause.With.class, (Clause.With x, List<Node> out) -> { one(out, x.projection()); opt(out, x.where()); });
        put(Clause.Return.class, (Clause.Return x, List<Node> out) -> { one(out, x.projection()); });
        put(Clause.Merge.class, (Clause.Merge x, List<Node> out) -> { one(out, x.part()); list(out, x.actions()); });
        put(Clause.SetClause.class, (Clause.SetClause x, List<Node> out) -> { list(out, x.items()); });
        put(Clause.Remove.class, (Clause.Remove x, List<Node> out) -> { list(out, x.items()); });
        put(Clause.Delete.class, (Clause.Delete x, List<Node> out) -> { list(out, x.targets()); });
        put(Clause.Foreach.class, (Clause.Foreach x, List<Node> out) -> { one(out, x.variable()); one(out, x.list()); list(out, x.body()); });
        put(Clause.LoadCsv.class, (Clause.LoadCsv x, List<Node> out) -> { one(out, x.source()); one(out, x.alias()); });
        put(Clause.CallProcedure.class, (Clause.CallProcedure x, List<Node> out) -> { list(out, x.args()); list(out, x.yields()); opt(out, x.where()); });
        put(Clause.CallSubquery.class, (Clause.CallSubquery x, List<Node> out) -> { one(out, x.body()); });
        put(Clause.ProjectionItem.class, (Clause.ProjectionItem x, List<Node> out) -> { one(out, x.expr()); opt(out, x.alias()); });
        put(Clause.SortItem.class, (Clause.SortItem x, List<Node> out) -> { one(out, x.expr()); });
        put(Clause.Projection.class, (Clause.Projection x, List<Node> out) -> { list(out, x.items()); list(out, x.orderBy()); opt(out, x.skip()); opt(out, x.limit()); });
        put(Clause.SetProperty.class, (Clause.SetProperty x, List<Node> out) -> { one(out, x.target()); one(out, x.value()); });
        put(Clause.SetVariable.class, (Clause.SetVariable x, List<Node> out) -> { one(out, x.target()); one(out, x.value()); });
        put(Clause.SetLabels.class, (Clause.SetLabels x, List<Node> out) -> { one(out, x.target()); });
        put(Clause.RemoveProperty.class, (Clause.RemoveProperty x, List<Node> out) -> { one(out, x.target()); });
        put(Clause.RemoveLabels.class, (Clause.RemoveLabels x, List<Node> out) -> { one(out, x.target()); });
        put(Clause.MergeAction.class, (Clause.MergeAction x, List<Node> out) -> { list(out, x.items()); });
        put(Clause.YieldItem.class, (Clause.YieldItem x, List<Node> out) -> { opt(out, x.alias()); });
        put(Pattern.class, (Pattern x, List<Node> out) -> { list(out, x.parts()); });
        put(Pattern.Part.class, (Pattern.Part x, List<Node> out) -> { opt(out, x.pathVariable()); one(out, x.start()); list(out, x.steps()); });
        put(Pattern.NodePattern.class, (Pattern.NodePattern x, List<Node> out) -> { opt(out, x.variable()); opt(out, x.labels()); opt(out, x.properties()); });
        put(Pattern.RelPattern.class, (Pattern.RelPattern x, List<Node> out) -> { opt(out, x.variable()); opt(out, x.types()); opt(out, x.properties()); });
        put(Pattern.Step.class, (Pattern.Step x, List<Node> out) -> { one(out, x.rel()); one(out, x.node()); });
        leaf(LabelExpr.Name.class);
        put(LabelExpr.And.class, (LabelExpr.And x, List<Node> out) -> { list(out, x.operands()); });
        put(LabelExpr.Or.class, (LabelExpr.Or x, List<Node> out) -> { list(out, x.operands()); });
        put(LabelExpr.Not.class, (LabelExpr.Not x, List<Node> out) -> { one(out, x.operand()); });
        leaf(LabelExpr.Wildcard.class);
        leaf(Expr.Variable.class);
        put(Expr.Binary.class, (Expr.Binary x, List<Node> out) -> { one(out, x.left()); one(out, x.right()); });
        put(Expr.FunctionCall.class, (Expr.FunctionCall x, List<Node> out) -> { list(out, x.args()); });
        put(Expr.Unary.class, (Expr.Unary x, List<Node> out) -> { one(out, x.operand()); });
        put(Expr.Case.class, (Expr.Case x, List<Node> out) -> { opt(out, x.subject()); list(out, x.whens()); opt(out, x.otherwise()); });
        put(Expr.Quantified.class, (Expr.Quantified x, List<Node> out) -> { one(out, x.variable()); one(out, x.source()); opt(out, x.where()); });
        put(Expr.MapProjection.class, (Expr.MapProjection x, List<Node> out) -> { one(out, x.variable()); list(out, x.items()); });
        put(Expr.Property.class, (Expr.Property x, List<Node> out) -> { one(out, x.target()); });
        leaf(Expr.Parameter.class);
        put(Expr.MapLit.class, (Expr.MapLit x, List<Node> out) -> { list(out, x.entries()); });
        leaf(Expr.IntegerLit.class);
        leaf(Expr.FloatLit.class);
        leaf(Expr.StringLit.class);
        leaf(Expr.BooleanLit.class);
        leaf(Expr.NullLit.class);
        put(Expr.ListLit.class, (Expr.ListLit x, List<Node> out) -> { list(out, x.elements()); });
        put(Expr.IsNull.class, (Expr.IsNull x, List<Node> out) -> { one(out, x.operand()); });
        put(Expr.HasLabels.class, (Expr.HasLabels x, List<Node> out) -> { one(out, x.target()); one(out, x.labels()); });
        put(Expr.Subscript.class, (Expr.Subscript x, List<Node> out) -> { one(out, x.target()); one(out, x.index()); });
        put(Expr.Slice.class, (Expr.Slice x, List<Node> out) -> { one(out, x.target()); opt(out, x.from()); opt(out, x.to()); });
        leaf(Expr.CountStar.class);
        put(Expr.ListComprehension.class, (Expr.ListComprehension x, List<Node> out) -> { one(out, x.variable()); one(out, x.source()); opt(out, x.where()); opt(out, x.map()); });
        put(Expr.PatternComprehension.class, (Expr.PatternComprehension x, List<Node> out) -> { one(out, x.pattern()); opt(out, x.where()); one(out, x.map()); });
        put(Expr.Reduce.class, (Expr.Reduce x, List<Node> out) -> { one(out, x.accumulator()); one(out, x.init()); one(out, x.variable()); one(out, x.source()); one(out, x.map()); });
        put(Expr.PatternPredicate.class, (Expr.PatternPredicate x, List<Node> out) -> { one(out, x.pattern()); });
        put(Expr.ExistsSubquery.class, (Expr.ExistsSubquery x, List<Node> out) -> { opt(out, x.pattern()); opt(out, x.where()); opt(out, x.query()); });
        put(Expr.CountSubquery.class, (Expr.CountSubquery x, List<Node> out) -> { opt(out, x.pattern()); opt(out, x.where()); opt(out, x.query()); });
        put(Expr.CaseWhen.class, (Expr.CaseWhen x, List<Node> out) -> { one(out, x.when()); one(out, x.then()); });
        put(Expr.MapEntry.class, (Expr.MapEntry x, List<Node> out) -> { one(out, x.value()); });
        leaf(Expr.PropertySelector.class);
        put(Expr.LiteralEntry.class, (Expr.LiteralEntry x, List<Node> out) -> { one(out, x.value()); });
        put(Expr.VariableSelector.class, (Expr.VariableSelector x, List<Node> out) -> { one(out, x.variable()); });
        leaf(Expr.AllProperties.class);

    }
}
