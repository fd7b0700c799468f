package dev.termgate.query;

/** Every node of the syntax tree: an immutable record that knows where it came from. */
public sealed interface Node permits Query, Query.UnionPart, SingleQuery, Clause, Clause.ProjectionItem,
        Clause.SortItem, Clause.Projection, Clause.SetItem, Clause.RemoveItem, Clause.MergeAction, Clause.YieldItem,
        Pattern, Pattern.Part, Pattern.NodePattern, Pattern.RelPattern, Pattern.Step, LabelExpr, Expr,
        Expr.CaseWhen, Expr.MapEntry, Expr.MapItem {
    Span span();
}
