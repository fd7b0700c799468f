package dev.termgate.parser;

import dev.termgate.diag.Code;
import dev.termgate.diag.Diagnostic;
import dev.termgate.parser.antlr.CypherBaseVisitor;
import dev.termgate.parser.antlr.CypherLexer;
import dev.termgate.parser.antlr.CypherParser.*;
import dev.termgate.query.Clause;
import dev.termgate.query.Expr;
import dev.termgate.query.LabelExpr;
import dev.termgate.query.Pattern;
import dev.termgate.query.Query;
import dev.termgate.query.SingleQuery;
import dev.termgate.query.Span;
import org.antlr.v4.runtime.ParserRuleContext;
import org.antlr.v4.runtime.Token;
import org.antlr.v4.runtime.tree.TerminalNode;

import java.math.BigInteger;
import java.util.ArrayList;
import java.util.List;
import java.util.Optional;

/**
 * Builds the immutable syntax tree from ANTLR's parse tree. Checks that the grammar leaves open (escapes, number
 * ranges, variable-length bounds written without {@code *}) are reported here, with the position of the offending
 * text; the builder then goes on with a placeholder so that every such fault is reported at once.
 */
final class TreeBuilder extends CypherBaseVisitor<Object> {

    private static final BigInteger LONG_MIN = BigInteger.valueOf(Long.MIN_VALUE);
    private static final BigInteger LONG_MAX = BigInteger.valueOf(Long.MAX_VALUE);

    private final SourceMap map;
    final List<Diagnostic> diagnostics = new ArrayList<>();
    /** How many path patterns were read as expressions; their placement is checked only when there are some. */
    int patternPredicates;

    TreeBuilder(SourceMap map) {
        this.map = map;
    }

    // ---------------------------------------------------------------- spans

    private Span span(ParserRuleContext ctx) {
        Token start = ctx.getStart();
        Token stop = ctx.getStop();
        int from = start.getType() == Token.EOF ? map.text().length() : map.offset(start.getStartIndex());
        if (stop == null || stop.getType() == Token.EOF || stop.getStopIndex() < start.getStartIndex()) {
            int end = stop != null && stop.getType() == Token.EOF ? map.text().length() : from;
            if (stop != null && stop.getType() == Token.EOF && stop.getTokenIndex() > 0) {
                end = Math.max(from, end);
            }
            return map.span(from, Math.max(from, end));
        }
        return map.span(from, map.offset(stop.getStopIndex() + 1));
    }

    private Span span(Token t) {
        return map.span(map.offset(t.getStartIndex()), map.offset(t.getStopIndex() + 1));
    }

    private Span span(ParserRuleContext from, ParserRuleContext to) {
        return span(from).to(span(to));
    }

    private Span span(Token from, ParserRuleContext to) {
        return span(from).to(span(to));
    }

    // ---------------------------------------------------------------- statements

    Query statement(StatementContext ctx) {
        return query(ctx.query());
    }

    private Query query(QueryContext ctx) {
        SingleQuery first = singleQuery(ctx.singleQuery());
        if (ctx.unionPart().isEmpty()) {
            return new Query(first, List.of(), span(ctx));
        }
        List<Query.UnionPart> unions = new ArrayList<>();
        for (UnionPartContext u : ctx.unionPart()) {
            unions.add(new Query.UnionPart(u.ALL() != null, singleQuery(u.singleQuery()), span(u)));
        }
        return new Query(first, unions, span(ctx));
    }

    private SingleQuery singleQuery(SingleQueryContext ctx) {
        List<Clause> clauses = clauses(ctx.clause());
        if (clauses.size() > 1) {
            for (Clause c : clauses) {
                if (c instanceof Clause.CallProcedure call && call.yieldStar()) {
                    // openCypher: YIELD * only in a standalone call (TCK Call5 [7])
                    diagnostics.add(Diagnostic.of(Code.SYNTAX_ERROR, call,
                            "YIELD * is allowed only when CALL is the whole query; name the fields to yield"));
                }
            }
        }
        return new SingleQuery(clauses, span(ctx));
    }

    private List<Clause> clauses(List<ClauseContext> list) {
        List<Clause> out = new ArrayList<>(list.size());
        for (ClauseContext c : list) out.add((Clause) visit(c));
        return out;
    }

    private Optional<Expr> where(WhereClauseContext ctx) {
        return ctx == null ? Optional.empty() : Optional.of(expr(ctx.expression()));
    }

    @Override
    public Object visitMatchClause(MatchClauseContext ctx) {
        return new Clause.Match(ctx.OPTIONAL() != null, pattern(ctx.pattern()), where(ctx.whereClause()), span(ctx));
    }

    @Override
    public Object visitUnwindClause(UnwindClauseContext ctx) {
        return new Clause.Unwind(expr(ctx.expression()), variable(ctx.variable()), span(ctx));
    }

    @Override
    public Object visitWithClause(WithClauseContext ctx) {
        return new Clause.With(projection(ctx.projectionBody()), where(ctx.whereClause()), span(ctx));
    }

    @Override
    public Object visitReturnClause(ReturnClauseContext ctx) {
        return new Clause.Return(projection(ctx.projectionBody()), span(ctx));
    }

    @Override
    public Object visitCreateClause(CreateClauseContext ctx) {
        return new Clause.Create(pattern(ctx.pattern()), span(ctx));
    }

    @Override
    public Object visitMergeClause(MergeClauseContext ctx) {
        List<Clause.MergeAction> actions = new ArrayList<>();
        for (MergeActionContext a : ctx.mergeAction()) {
            actions.add(new Clause.MergeAction(a.CREATE() != null, setItems(a.setItem()), span(a)));
        }
        return new Clause.Merge(patternPart(ctx.patternPart()), actions, span(ctx));
    }

    @Override
    public Object visitSetClause(SetClauseContext ctx) {
        return new Clause.SetClause(setItems(ctx.setItem()), span(ctx));
    }

    private List<Clause.SetItem> setItems(List<SetItemContext> items) {
        List<Clause.SetItem> out = new ArrayList<>(items.size());
        for (SetItemContext i : items) out.add((Clause.SetItem) visit(i));
        return out;
    }

    @Override
    public Object visitSetPropertyItem(SetPropertyItemContext ctx) {
        return new Clause.SetProperty(propertyExpression(ctx.propertyExpression()), expr(ctx.expression()), span(ctx));
    }

    @Override
    public Object visitSetVariableItem(SetVariableItemContext ctx) {
        return new Clause.SetVariable(variable(ctx.variable()), expr(ctx.expression()), false, span(ctx));
    }

    @Override
    public Object visitSetMergeItem(SetMergeItemContext ctx) {
        return new Clause.SetVariable(variable(ctx.variable()), expr(ctx.expression()), true, span(ctx));
    }

    @Override
    public Object visitSetLabelsItem(SetLabelsItemContext ctx) {
        return new Clause.SetLabels(variable(ctx.variable()), plainLabels(ctx.nodeLabels()), span(ctx));
    }

    @Override
    public Object visitRemoveClause(RemoveClauseContext ctx) {
        List<Clause.RemoveItem> items = new ArrayList<>();
        for (RemoveItemContext i : ctx.removeItem()) items.add((Clause.RemoveItem) visit(i));
        return new Clause.Remove(items, span(ctx));
    }

    @Override
    public Object visitRemoveLabelsItem(RemoveLabelsItemContext ctx) {
        return new Clause.RemoveLabels(variable(ctx.variable()), plainLabels(ctx.nodeLabels()), span(ctx));
    }

    @Override
    public Object visitRemovePropertyItem(RemovePropertyItemContext ctx) {
        return new Clause.RemoveProperty(propertyExpression(ctx.propertyExpression()), span(ctx));
    }

    /** SET and REMOVE name plain labels; a GQL label expression there is refused. */
    private List<String> plainLabels(NodeLabelsContext ctx) {
        LabelExpr e = nodeLabels(ctx);
        List<String> names = new ArrayList<>();
        if (e instanceof LabelExpr.Name n) {
            names.add(n.name());
        } else if (e instanceof LabelExpr.And and && and.operands().stream().allMatch(o -> o instanceof LabelExpr.Name)) {
            and.operands().forEach(o -> names.add(((LabelExpr.Name) o).name()));
        } else {
            diagnostics.add(Diagnostic.at(Code.SYNTAX_ERROR, span(ctx), "only plain labels (:A:B) can be set or removed"));
        }
        return names;
    }

    private Expr.Property propertyExpression(PropertyExpressionContext ctx) {
        Expr target = (Expr) visit(ctx.atom());
        Expr.Property p = null;
        for (PropertyKeyNameContext k : ctx.propertyKeyName()) {
            p = new Expr.Property(target, propertyKey(k), span(ctx.getStart(), k));
            target = p;
        }
        return p;
    }

    @Override
    public Object visitDeleteClause(DeleteClauseContext ctx) {
        return new Clause.Delete(ctx.DETACH() != null, exprs(ctx.expression()), span(ctx));
    }

    @Override
    public Object visitForeachClause(ForeachClauseContext ctx) {
        return new Clause.Foreach(variable(ctx.variable()), expr(ctx.expression()), clauses(ctx.clause()), span(ctx));
    }

    @Override
    public Object visitLoadCsvClause(LoadCsvClauseContext ctx) {
        Optional<String> terminator = ctx.StringLiteral() == null ? Optional.empty()
                : Optional.of(string(ctx.StringLiteral().getSymbol()));
        return new Clause.LoadCsv(ctx.HEADERS() != null, expr(ctx.expression()), variable(ctx.variable()), terminator,
                span(ctx));
    }

    @Override
    public Object visitCallSubqueryClause(CallSubqueryClauseContext ctx) {
        return new Clause.CallSubquery(query(ctx.query()), span(ctx));
    }

    @Override
    public Object visitCallProcedureClause(CallProcedureClauseContext ctx) {
        List<SymbolicNameContext> parts = ctx.procedureName().symbolicName();
        List<String> namespace = new ArrayList<>();
        for (int i = 0; i < parts.size() - 1; i++) namespace.add(name(parts.get(i)));
        String name = name(parts.get(parts.size() - 1));
        boolean implicit = ctx.LPAREN() == null;
        List<Clause.YieldItem> yields = new ArrayList<>();
        boolean star = false;
        Optional<Expr> where = Optional.empty();
        YieldItemsContext y = ctx.yieldItems();
        if (y instanceof YieldAllContext all) {
            star = true;
            where = where(all.whereClause());
        } else if (y instanceof YieldListContext list) {
            for (YieldItemContext item : list.yieldItem()) {
                yields.add(new Clause.YieldItem(schemaName(item.schemaName()),
                        Optional.ofNullable(item.variable()).map(this::variable), span(item)));
            }
            where = where(list.whereClause());
        }
        return new Clause.CallProcedure(namespace, name, exprs(ctx.expression()), implicit, yields, star, where,
                span(ctx));
    }

    // ---------------------------------------------------------------- projections

    private Clause.Projection projection(ProjectionBodyContext ctx) {
        boolean star = false;
        List<ProjectionItemContext> items;
        if (ctx.projectionItems() instanceof ProjectStarContext s) {
            star = true;
            items = s.projectionItem();
        } else {
            items = ((ProjectListContext) ctx.projectionItems()).projectionItem();
        }
        List<Clause.ProjectionItem> out = new ArrayList<>(items.size());
        for (ProjectionItemContext i : items) {
            out.add(new Clause.ProjectionItem(expr(i.expression()),
                    Optional.ofNullable(i.variable()).map(this::variable), span(i)));
        }
        List<Clause.SortItem> order = new ArrayList<>();
        if (ctx.orderBy() != null) {
            for (SortItemContext s : ctx.orderBy().sortItem()) {
                order.add(new Clause.SortItem(expr(s.expression()), s.DESC() != null || s.DESCENDING() != null,
                        span(s)));
            }
        }
        Optional<Expr> skip = ctx.skip() == null ? Optional.empty() : Optional.of(expr(ctx.skip().expression()));
        Optional<Expr> limit = ctx.limit() == null ? Optional.empty() : Optional.of(expr(ctx.limit().expression()));
        return new Clause.Projection(ctx.DISTINCT() != null, star, out, order, skip, limit, span(ctx));
    }

    // ---------------------------------------------------------------- patterns

    private Pattern pattern(PatternContext ctx) {
        List<Pattern.Part> parts = new ArrayList<>();
        for (PatternPartContext p : ctx.patternPart()) parts.add(patternPart(p));
        return new Pattern(parts, span(ctx));
    }

    private Pattern.Part patternPart(PatternPartContext ctx) {
        Optional<Expr.Variable> pathVar = Optional.ofNullable(ctx.variable()).map(this::variable);
        AnonymousPatternPartContext a = ctx.anonymousPatternPart();
        Pattern.PathKind kind;
        PatternElementContext element;
        if (a instanceof ShortestPathPartContext s) {
            kind = Pattern.PathKind.SHORTEST;
            element = s.patternElement();
        } else if (a instanceof AllShortestPathsPartContext s) {
            kind = Pattern.PathKind.ALL_SHORTEST;
            element = s.patternElement();
        } else {
            kind = Pattern.PathKind.PLAIN;
            element = ((PlainPartContext) a).patternElement();
        }
        while (element instanceof ParenthesizedElementContext p) element = p.patternElement();
        ChainElementContext chain = (ChainElementContext) element;
        return path(pathVar, kind, chain.nodePattern(), chain.patternElementChain(), span(ctx));
    }

    private Pattern.Part path(Optional<Expr.Variable> pathVar, Pattern.PathKind kind, NodePatternContext start,
                              List<PatternElementChainContext> chain, Span span) {
        List<Pattern.Step> steps = new ArrayList<>(chain.size());
        for (PatternElementChainContext c : chain) {
            steps.add(new Pattern.Step(relationship(c.relationshipPattern()), nodePattern(c.nodePattern()), span(c)));
        }
        return new Pattern.Part(pathVar, kind, nodePattern(start), steps, span);
    }

    private Pattern.NodePattern nodePattern(NodePatternContext ctx) {
        return new Pattern.NodePattern(Optional.ofNullable(ctx.variable()).map(this::variable),
                Optional.ofNullable(ctx.nodeLabels()).map(this::nodeLabels),
                Optional.ofNullable(ctx.properties()).map(this::properties), span(ctx));
    }

    private Expr properties(PropertiesContext ctx) {
        if (ctx instanceof MapPropertiesContext m) return mapLiteral(m.mapLiteral());
        return parameter(((ParameterPropertiesContext) ctx).parameter());
    }

    private Pattern.RelPattern relationship(RelationshipPatternContext ctx) {
        Pattern.Direction dir = ctx.left != null && ctx.right == null ? Pattern.Direction.INCOMING
                : ctx.right != null && ctx.left == null ? Pattern.Direction.OUTGOING : Pattern.Direction.BOTH;
        RelationshipDetailContext detail = ctx.relationshipDetail();
        if (detail == null) {
            return new Pattern.RelPattern(dir, Optional.empty(), Optional.empty(), Optional.empty(), Optional.empty(),
                    span(ctx));
        }
        Optional<LabelExpr> types = detail.relationshipTypes() == null ? Optional.empty()
                : Optional.of(labelExpression(detail.relationshipTypes().labelExpression()));
        return new Pattern.RelPattern(dir, Optional.ofNullable(detail.variable()).map(this::variable), types,
                Optional.ofNullable(detail.rangeLiteral()).map(this::range),
                Optional.ofNullable(detail.properties()).map(this::properties), span(ctx));
    }

    private Pattern.Length range(RangeLiteralContext ctx) {
        if (ctx instanceof BareRangeContext bare) {
            diagnostics.add(Diagnostic.at(Code.INVALID_RELATIONSHIP_PATTERN, span(bare),
                    "a variable length needs '*', as in *1..3"));
            return new Pattern.Length(Optional.empty(), Optional.empty());
        }
        StarRangeContext s = (StarRangeContext) ctx;
        List<IntegerLiteralContext> ints = s.integerLiteral();
        Optional<Long> min = Optional.empty();
        Optional<Long> max = Optional.empty();
        if (s.DOTDOT() == null) {
            if (!ints.isEmpty()) {
                long v = bound(ints.get(0));
                min = Optional.of(v);
                max = Optional.of(v);
            }
        } else {
            for (IntegerLiteralContext i : ints) {
                if (i.getStart().getTokenIndex() < s.DOTDOT().getSymbol().getTokenIndex()) {
                    min = Optional.of(bound(i));
                } else {
                    max = Optional.of(bound(i));
                }
            }
        }
        return new Pattern.Length(min, max);
    }

    private long bound(IntegerLiteralContext ctx) {
        Long v = integer(ctx, false);
        return v == null ? 0 : v;
    }

    // ---------------------------------------------------------------- labels

    private LabelExpr nodeLabels(NodeLabelsContext ctx) {
        List<LabelExpressionContext> parts = ctx.labelExpression();
        if (parts.size() == 1) return labelExpression(parts.get(0));
        List<LabelExpr> ops = new ArrayList<>();
        for (LabelExpressionContext p : parts) addFlattened(ops, labelExpression(p), true);
        return new LabelExpr.And(ops, span(ctx));
    }

    private LabelExpr labelPredicate(LabelPredicateContext ctx) {
        List<LabelConjunctionContext> parts = ctx.labelConjunction();
        List<LabelExpr> ops = new ArrayList<>();
        for (LabelConjunctionContext p : parts) addFlattened(ops, labelConjunction(p), true);
        return ops.size() == 1 ? ops.get(0) : new LabelExpr.And(ops, span(ctx));
    }

    private LabelExpr labelConjunction(LabelConjunctionContext ctx) {
        List<LabelExpr> ops = new ArrayList<>();
        for (LabelFactorContext f : ctx.labelFactor()) addFlattened(ops, labelFactor(f), true);
        return ops.size() == 1 ? ops.get(0) : new LabelExpr.And(ops, span(ctx));
    }

    private LabelExpr labelFactor(LabelFactorContext ctx) {
        if (ctx instanceof LabelFactorNotContext n) return new LabelExpr.Not(labelFactor(n.labelFactor()), span(ctx));
        if (ctx instanceof LabelFactorParenContext p) return labelExpression(p.labelExpression());
        if (ctx instanceof LabelFactorAnyContext) return new LabelExpr.Wildcard(span(ctx));
        return new LabelExpr.Name(schemaName(((LabelFactorNameContext) ctx).schemaName()), span(ctx));
    }

    private LabelExpr labelExpression(LabelExpressionContext ctx) {
        if (ctx instanceof LabelNotContext n) return new LabelExpr.Not(labelExpression(n.labelExpression()), span(ctx));
        if (ctx instanceof LabelParenContext p) return labelExpression(p.labelExpression());
        if (ctx instanceof LabelAnyContext) return new LabelExpr.Wildcard(span(ctx));
        if (ctx instanceof LabelNameContext n) return new LabelExpr.Name(schemaName(n.schemaName()), span(ctx));
        if (ctx instanceof LabelAndContext a) {
            List<LabelExpr> ops = new ArrayList<>();
            for (LabelExpressionContext o : a.labelExpression()) addFlattened(ops, labelExpression(o), true);
            return new LabelExpr.And(ops, span(ctx));
        }
        LabelOrContext o = (LabelOrContext) ctx;
        List<LabelExpr> ops = new ArrayList<>();
        for (LabelExpressionContext e : o.labelExpression()) addFlattened(ops, labelExpression(e), false);
        return new LabelExpr.Or(ops, span(ctx));
    }

    /** {@code :A:B}, {@code :A&B} and {@code (A&B)&C} read to one flat conjunction (likewise for |). */
    private static void addFlattened(List<LabelExpr> ops, LabelExpr e, boolean and) {
        if (and && e instanceof LabelExpr.And a) {
            ops.addAll(a.operands());
        } else if (!and && e instanceof LabelExpr.Or o) {
            ops.addAll(o.operands());
        } else {
            ops.add(e);
        }
    }

    // ---------------------------------------------------------------- expressions

    private List<Expr> exprs(List<ExpressionContext> list) {
        List<Expr> out = new ArrayList<>(list.size());
        for (ExpressionContext e : list) out.add(expr(e));
        return out;
    }

    Expr expr(ExpressionContext ctx) {
        return (Expr) visit(ctx);
    }

    @Override
    public Object visitAtomExpr(AtomExprContext ctx) {
        return visit(ctx.atom());
    }

    @Override
    public Object visitPropertyExpr(PropertyExprContext ctx) {
        return new Expr.Property(expr(ctx.expression()), propertyKey(ctx.propertyKeyName()), span(ctx));
    }

    @Override
    public Object visitSubscriptExpr(SubscriptExprContext ctx) {
        return new Expr.Subscript(expr(ctx.expression(0)), expr(ctx.expression(1)), span(ctx));
    }

    @Override
    public Object visitSliceExpr(SliceExprContext ctx) {
        return new Expr.Slice(expr(ctx.expression(0)), Optional.ofNullable(ctx.from).map(this::expr),
                Optional.ofNullable(ctx.to).map(this::expr), span(ctx));
    }

    @Override
    public Object visitLabelsExpr(LabelsExprContext ctx) {
        return new Expr.HasLabels(expr(ctx.expression()), labelPredicate(ctx.labelPredicate()), span(ctx));
    }

    @Override
    public Object visitUnaryExpr(UnaryExprContext ctx) {
        boolean minus = ctx.MINUS() != null;
        ExpressionContext operand = ctx.expression();
        // A minus sign directly before a number literal is part of it: -9223372036854775808 fits, its positive does not.
        if (minus && operand instanceof AtomExprContext a && a.atom() instanceof LiteralAtomContext l
                && l.literal() instanceof NumberLitContext n) {
            if (n.numberLiteral() instanceof IntegerNumberContext i) {
                Long v = integer(i.integerLiteral(), true);
                return new Expr.IntegerLit(v == null ? 0 : v, span(ctx));
            }
            if (n.numberLiteral() instanceof FloatNumberContext f) {
                return new Expr.FloatLit(-floating(f.FloatLiteral().getSymbol()), span(ctx));
            }
        }
        return new Expr.Unary(minus ? Expr.UnaryOp.MINUS : Expr.UnaryOp.PLUS, expr(operand), span(ctx));
    }

    @Override
    public Object visitPowerExpr(PowerExprContext ctx) {
        return binary(Expr.BinaryOp.POW, ctx.expression(0), ctx.expression(1), ctx);
    }

    @Override
    public Object visitMultiplyExpr(MultiplyExprContext ctx) {
        Expr.BinaryOp op = ctx.STAR() != null ? Expr.BinaryOp.MUL : ctx.SLASH() != null ? Expr.BinaryOp.DIV
                : Expr.BinaryOp.MOD;
        return binary(op, ctx.expression(0), ctx.expression(1), ctx);
    }

    @Override
    public Object visitAddExpr(AddExprContext ctx) {
        return binary(ctx.PLUS() != null ? Expr.BinaryOp.ADD : Expr.BinaryOp.SUB, ctx.expression(0), ctx.expression(1),
                ctx);
    }

    @Override
    public Object visitStringListExpr(StringListExprContext ctx) {
        Expr.BinaryOp op = ctx.STARTS() != null ? Expr.BinaryOp.STARTS_WITH : ctx.ENDS() != null
                ? Expr.BinaryOp.ENDS_WITH : ctx.CONTAINS() != null ? Expr.BinaryOp.CONTAINS : ctx.IN() != null
                ? Expr.BinaryOp.IN : Expr.BinaryOp.REGEX;
        return binary(op, ctx.expression(0), ctx.expression(1), ctx);
    }

    @Override
    public Object visitIsNullExpr(IsNullExprContext ctx) {
        return new Expr.IsNull(expr(ctx.expression()), ctx.NOT() != null, span(ctx));
    }

    /**
     * {@code a < b < c} means {@code a < b AND b < c} in openCypher: a chain is read as that conjunction, so the
     * tree (and the printer) need no chain node. A parenthesized comparison on the left is a plain operand.
     */
    @Override
    public Object visitComparisonExpr(ComparisonExprContext ctx) {
        Token opToken = ((TerminalNode) ctx.getChild(1)).getSymbol();
        Expr.BinaryOp op = switch (opToken.getType()) {
            case CypherLexer.EQ -> Expr.BinaryOp.EQ;
            case CypherLexer.NE -> Expr.BinaryOp.NE;
            case CypherLexer.LT -> Expr.BinaryOp.LT;
            case CypherLexer.GT -> Expr.BinaryOp.GT;
            case CypherLexer.LE -> Expr.BinaryOp.LE;
            default -> Expr.BinaryOp.GE;
        };
        Expr left = expr(ctx.expression(0));
        Expr right = expr(ctx.expression(1));
        if (ctx.expression(0) instanceof ComparisonExprContext) {
            Expr middle = lastComparand(left);
            Expr link = new Expr.Binary(op, middle, right, middle.span().to(right.span()));
            return new Expr.Binary(Expr.BinaryOp.AND, left, link, span(ctx));
        }
        return new Expr.Binary(op, left, right, span(ctx));
    }

    /** The right operand of the last comparison of a chain already read as a conjunction. */
    private static Expr lastComparand(Expr chain) {
        Expr.Binary b = (Expr.Binary) chain;
        if (b.op() == Expr.BinaryOp.AND) return lastComparand(b.right());
        return b.right();
    }

    @Override
    public Object visitNotExpr(NotExprContext ctx) {
        return new Expr.Unary(Expr.UnaryOp.NOT, expr(ctx.expression()), span(ctx));
    }

    @Override
    public Object visitAndExpr(AndExprContext ctx) {
        return binary(Expr.BinaryOp.AND, ctx.expression(0), ctx.expression(1), ctx);
    }

    @Override
    public Object visitXorExpr(XorExprContext ctx) {
        return binary(Expr.BinaryOp.XOR, ctx.expression(0), ctx.expression(1), ctx);
    }

    @Override
    public Object visitOrExpr(OrExprContext ctx) {
        return binary(Expr.BinaryOp.OR, ctx.expression(0), ctx.expression(1), ctx);
    }

    private Expr binary(Expr.BinaryOp op, ExpressionContext l, ExpressionContext r, ParserRuleContext ctx) {
        return new Expr.Binary(op, expr(l), expr(r), span(ctx));
    }

    // ---------------------------------------------------------------- atoms

    @Override
    public Object visitLiteralAtom(LiteralAtomContext ctx) {
        return visit(ctx.literal());
    }

    @Override
    public Object visitParameterAtom(ParameterAtomContext ctx) {
        return parameter(ctx.parameter());
    }

    private Expr.Parameter parameter(ParameterContext ctx) {
        String name = ctx.symbolicName() != null ? name(ctx.symbolicName()) : ctx.DecimalInteger().getText();
        return new Expr.Parameter(name, span(ctx));
    }

    @Override
    public Object visitCountStarAtom(CountStarAtomContext ctx) {
        return new Expr.CountStar(span(ctx));
    }

    @Override
    public Object visitCaseAtom(CaseAtomContext ctx) {
        // The subject is the expression before the first WHEN; ELSE's expression follows the last alternative.
        Optional<Expr> subject = Optional.empty();
        Optional<Expr> otherwise = Optional.empty();
        int firstWhen = ctx.caseAlternative(0).getStart().getTokenIndex();
        for (ExpressionContext e : ctx.expression()) {
            if (e.getStart().getTokenIndex() < firstWhen) {
                subject = Optional.of(expr(e));
            } else {
                otherwise = Optional.of(expr(e));
            }
        }
        List<Expr.CaseWhen> whens = new ArrayList<>();
        for (CaseAlternativeContext a : ctx.caseAlternative()) {
            whens.add(new Expr.CaseWhen(expr(a.expression(0)), expr(a.expression(1)), span(a)));
        }
        return new Expr.Case(subject, whens, otherwise, span(ctx));
    }

    @Override
    public Object visitListComprehensionAtom(ListComprehensionAtomContext ctx) {
        Optional<Expr> where = Optional.empty();
        Optional<Expr> mapped = Optional.empty();
        List<ExpressionContext> es = ctx.expression();
        int i = 1;
        if (ctx.WHERE() != null) where = Optional.of(expr(es.get(i++)));
        if (ctx.PIPE() != null) mapped = Optional.of(expr(es.get(i)));
        return new Expr.ListComprehension(variable(ctx.variable()), expr(es.get(0)), where, mapped, span(ctx));
    }

    @Override
    public Object visitPatternComprehensionAtom(PatternComprehensionAtomContext ctx) {
        Optional<Expr.Variable> pathVar = Optional.ofNullable(ctx.variable()).map(this::variable);
        RelationshipsPatternContext rp = ctx.relationshipsPattern();
        Span partSpan = pathVar.isPresent() ? span(ctx.variable(), rp) : span(rp);
        Pattern.Part part = path(pathVar, Pattern.PathKind.PLAIN, rp.nodePattern(), rp.patternElementChain(), partSpan);
        List<ExpressionContext> es = ctx.expression();
        Optional<Expr> where = ctx.WHERE() != null ? Optional.of(expr(es.get(0))) : Optional.empty();
        return new Expr.PatternComprehension(part, where, expr(es.get(es.size() - 1)), span(ctx));
    }

    @Override
    public Object visitQuantifierAtom(QuantifierAtomContext ctx) {
        QuantifierContext q = ctx.quantifier();
        Expr.Quantifier kind = q instanceof QuantAllContext ? Expr.Quantifier.ALL
                : q instanceof QuantAnyContext ? Expr.Quantifier.ANY
                : q instanceof QuantNoneContext ? Expr.Quantifier.NONE : Expr.Quantifier.SINGLE;
        Optional<Expr> where = ctx.WHERE() != null ? Optional.of(expr(ctx.expression(1))) : Optional.empty();
        return new Expr.Quantified(kind, variable(ctx.variable()), expr(ctx.expression(0)), where, span(ctx));
    }

    @Override
    public Object visitReduceAtom(ReduceAtomContext ctx) {
        return new Expr.Reduce(variable(ctx.variable(0)), expr(ctx.expression(0)), variable(ctx.variable(1)),
                expr(ctx.expression(1)), expr(ctx.expression(2)), span(ctx));
    }

    @Override
    public Object visitExistsSubqueryAtom(ExistsSubqueryAtomContext ctx) {
        SubqueryBodyContext body = ctx.subqueryBody();
        if (body instanceof FullSubqueryContext f) {
            return new Expr.ExistsSubquery(Optional.empty(), Optional.empty(), Optional.of(query(f.query())), span(ctx));
        }
        PatternSubqueryContext p = (PatternSubqueryContext) body;
        return new Expr.ExistsSubquery(Optional.of(pattern(p.pattern())), where(p.whereClause()), Optional.empty(),
                span(ctx));
    }

    @Override
    public Object visitCountSubqueryAtom(CountSubqueryAtomContext ctx) {
        SubqueryBodyContext body = ctx.subqueryBody();
        if (body instanceof FullSubqueryContext f) {
            return new Expr.CountSubquery(Optional.empty(), Optional.empty(), Optional.of(query(f.query())), span(ctx));
        }
        PatternSubqueryContext p = (PatternSubqueryContext) body;
        return new Expr.CountSubquery(Optional.of(pattern(p.pattern())), where(p.whereClause()), Optional.empty(),
                span(ctx));
    }

    @Override
    public Object visitPatternAtom(PatternAtomContext ctx) {
        RelationshipsPatternContext rp = ctx.relationshipsPattern();
        Pattern.Part part = path(Optional.empty(), Pattern.PathKind.PLAIN, rp.nodePattern(), rp.patternElementChain(),
                span(rp));
        patternPredicates++;
        return new Expr.PatternPredicate(part, span(ctx));
    }

    @Override
    public Object visitParenAtom(ParenAtomContext ctx) {
        return expr(ctx.expression());
    }

    @Override
    public Object visitFunctionAtom(FunctionAtomContext ctx) {
        FunctionNameContext fn = ctx.functionName();
        List<String> namespace = new ArrayList<>();
        for (SymbolicNameContext s : fn.symbolicName()) namespace.add(name(s));
        String name = fn.functionNamePart().getText();
        if (fn.functionNamePart() instanceof PlainFunctionNameContext p) name = name(p.symbolicName());
        return new Expr.FunctionCall(namespace, name, ctx.DISTINCT() != null, exprs(ctx.expression()), span(ctx));
    }

    @Override
    public Object visitMapProjectionAtom(MapProjectionAtomContext ctx) {
        List<Expr.MapItem> items = new ArrayList<>();
        for (MapProjectionItemContext i : ctx.mapProjectionItem()) {
            if (i instanceof MapAllPropertiesContext) {
                items.add(new Expr.AllProperties(span(i)));
            } else if (i instanceof MapPropertySelectorContext p) {
                items.add(new Expr.PropertySelector(propertyKey(p.propertyKeyName()), span(i)));
            } else if (i instanceof MapLiteralEntryContext e) {
                items.add(new Expr.LiteralEntry(propertyKey(e.propertyKeyName()), expr(e.expression()), span(i)));
            } else {
                Expr.Variable v = variable(((MapVariableSelectorContext) i).variable());
                items.add(new Expr.VariableSelector(v, span(i)));
            }
        }
        return new Expr.MapProjection(variable(ctx.variable()), items, span(ctx));
    }

    @Override
    public Object visitVariableAtom(VariableAtomContext ctx) {
        return variable(ctx.variable());
    }

    // ---------------------------------------------------------------- literals

    @Override
    public Object visitNumberLit(NumberLitContext ctx) {
        NumberLiteralContext n = ctx.numberLiteral();
        if (n instanceof IntegerNumberContext i) {
            Long v = integer(i.integerLiteral(), false);
            return new Expr.IntegerLit(v == null ? 0 : v, span(ctx));
        }
        if (n instanceof FloatNumberContext f) {
            return new Expr.FloatLit(floating(f.FloatLiteral().getSymbol()), span(ctx));
        }
        Token bad = ((BadNumberContext) n).InvalidNumber().getSymbol();
        diagnostics.add(Diagnostic.at(Code.INVALID_NUMBER, span(bad), bad.getText()));
        return new Expr.IntegerLit(0, span(ctx));
    }

    @Override
    public Object visitStringLit(StringLitContext ctx) {
        return new Expr.StringLit(string(ctx.StringLiteral().getSymbol()), span(ctx));
    }

    @Override
    public Object visitTrueLit(TrueLitContext ctx) {
        return new Expr.BooleanLit(true, span(ctx));
    }

    @Override
    public Object visitFalseLit(FalseLitContext ctx) {
        return new Expr.BooleanLit(false, span(ctx));
    }

    @Override
    public Object visitNullLit(NullLitContext ctx) {
        return new Expr.NullLit(span(ctx));
    }

    @Override
    public Object visitListLit(ListLitContext ctx) {
        return new Expr.ListLit(exprs(ctx.expression()), span(ctx));
    }

    @Override
    public Object visitMapLit(MapLitContext ctx) {
        return mapLiteral(ctx.mapLiteral());
    }

    private Expr.MapLit mapLiteral(MapLiteralContext ctx) {
        List<Expr.MapEntry> entries = new ArrayList<>();
        for (MapEntryContext e : ctx.mapEntry()) {
            entries.add(new Expr.MapEntry(propertyKey(e.propertyKeyName()), expr(e.expression()), span(e)));
        }
        return new Expr.MapLit(entries, span(ctx));
    }

    /** The value of an integer literal, or null (with a diagnostic) when it does not fit in a long. */
    private Long integer(IntegerLiteralContext ctx, boolean negative) {
        Token t = ctx.getStart();
        String text = t.getText();
        BigInteger v;
        if (ctx instanceof HexIntContext) {
            v = new BigInteger(text.substring(2), 16);
        } else if (ctx instanceof OctalIntContext) {
            v = new BigInteger(text.substring(2), 8);
        } else {
            v = new BigInteger(text);
        }
        if (negative) v = v.negate();
        if (v.compareTo(LONG_MIN) < 0 || v.compareTo(LONG_MAX) > 0) {
            diagnostics.add(Diagnostic.at(Code.INTEGER_OVERFLOW, span(ctx), (negative ? "-" : "") + text));
            return null;
        }
        return v.longValue();
    }

    private double floating(Token t) {
        double v = Double.parseDouble(t.getText());
        if (Double.isInfinite(v)) {
            diagnostics.add(Diagnostic.at(Code.FLOAT_OVERFLOW, span(t), t.getText()));
            return 0;
        }
        return v;
    }

    /** The value of a quoted string with its escapes resolved; bad escapes are reported at their position. */
    private String string(Token t) {
        String raw = t.getText();
        int quoteOffset = map.offset(t.getStartIndex());
        StringBuilder sb = new StringBuilder(raw.length());
        int end = raw.length() - 1;
        for (int i = 1; i < end; i++) {
            char c = raw.charAt(i);
            if (c != '\\') {
                sb.append(c);
                continue;
            }
            char e = raw.charAt(i + 1);
            switch (e) {
                case '\\' -> sb.append('\\');
                case '\'' -> sb.append('\'');
                case '"' -> sb.append('"');
                case 'b', 'B' -> sb.append('\b');
                case 'f', 'F' -> sb.append('\f');
                case 'n', 'N' -> sb.append('\n');
                case 'r', 'R' -> sb.append('\r');
                case 't', 'T' -> sb.append('\t');
                case 'u', 'U' -> {
                    int digits = e == 'u' ? 4 : 8;
                    int from = i + 2;
                    int to = from;
                    while (to < end && to - from < digits && isHex(raw.charAt(to))) to++;
                    if (to - from < digits) {
                        diagnostics.add(Diagnostic.at(Code.INVALID_UNICODE_LITERAL,
                                stringSpan(quoteOffset, i, Math.min(end, Math.max(to, i + 3))),
                                raw.substring(i, Math.min(end, Math.max(to, i + 3)))));
                        i = to - 1;
                        continue;
                    }
                    int cp = (int) Long.parseLong(raw.substring(from, to), 16);
                    if (!Character.isValidCodePoint(cp)) {
                        diagnostics.add(Diagnostic.at(Code.INVALID_UNICODE_LITERAL,
                                stringSpan(quoteOffset, i, to), raw.substring(i, to)));
                    } else {
                        sb.appendCodePoint(cp);
                    }
                    i = to - 1;
                    continue;
                }
                default -> diagnostics.add(Diagnostic.at(Code.INVALID_ESCAPE,
                        stringSpan(quoteOffset, i, i + 2), raw.substring(i, i + 2)));
            }
            i++;
        }
        return sb.toString();
    }

    /** Span of {@code [from, to)} inside a string token; token text is UTF-16, so its offsets add directly. */
    private Span stringSpan(int tokenOffset, int from, int to) {
        return map.span(tokenOffset + from, tokenOffset + to);
    }

    private static boolean isHex(char c) {
        return (c >= '0' && c <= '9') || (c >= 'a' && c <= 'f') || (c >= 'A' && c <= 'F');
    }

    // ---------------------------------------------------------------- names

    private Expr.Variable variable(VariableContext ctx) {
        return new Expr.Variable(name(ctx.symbolicName()), span(ctx));
    }

    private String propertyKey(PropertyKeyNameContext ctx) {
        return schemaName(ctx.schemaName());
    }

    private String schemaName(SchemaNameContext ctx) {
        if (ctx instanceof SymbolicSchemaNameContext s) return name(s.symbolicName());
        return text(ctx);
    }

    private String name(SymbolicNameContext ctx) {
        if (ctx instanceof EscapedSymbolicNameContext e) {
            String raw = e.EscapedName().getText();
            return raw.substring(1, raw.length() - 1).replace("``", "`");
        }
        return text(ctx);
    }

    /** The text of a rule; for the usual one-token rule that token's text, without the generic concatenation. */
    private static String text(ParserRuleContext ctx) {
        Token start = ctx.getStart();
        if (start != null && start == ctx.getStop() && start.getType() != Token.EOF) return start.getText();
        return ctx.getText();
    }
}
