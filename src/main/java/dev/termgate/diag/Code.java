package dev.termgate.diag;

import java.util.Locale;

/**
 * Every diagnostic the tool can give: a stable code, a default severity and the one message template
 * for it. Codes are never renumbered; new ones take the next free number in their band.
 *
 * <ul>
 *   <li>TG1xxx — syntax (parser)</li>
 *   <li>TG2xxx — scope and typing of variables and expressions (analyzer)</li>
 *   <li>TG3xxx — terms checked against the ontology-derived schema (analyzer)</li>
 *   <li>TG4xxx — read-only enforcement (analyzer; a security boundary)</li>
 *   <li>TG5xxx — running a query (engine)</li>
 *   <li>TG6xxx — reading an ontology or instance data (ontology, graph import)</li>
 *   <li>TG7xxx — translation by a model or the offline interpreter</li>
 * </ul>
 *
 * Templates use {@link String#format} placeholders; arguments are quoted by the caller's factory.
 */
public enum Code {
    // ---- TG1xxx syntax ----
    SYNTAX_ERROR(1001, Severity.ERROR, "%s"),
    UNEXPECTED_INPUT(1002, Severity.ERROR, "unexpected %s; expected %s"),
    EMPTY_QUERY(1003, Severity.ERROR, "the query is empty"),
    UNTERMINATED_STRING(1004, Severity.ERROR, "string literal is not terminated"),
    INVALID_ESCAPE(1005, Severity.ERROR, "invalid escape sequence '%s' in string literal"),
    INVALID_NUMBER(1006, Severity.ERROR, "invalid number literal '%s'"),
    INVALID_UNICODE_LITERAL(1007, Severity.ERROR, "invalid unicode escape '%s'"),
    INVALID_CHARACTER(1008, Severity.ERROR, "character %s is not allowed here"),
    INVALID_RELATIONSHIP_PATTERN(1009, Severity.ERROR, "invalid relationship pattern: %s"),
    TOO_DEEP(1010, Severity.ERROR, "the query nests deeper than %d levels"),
    TOO_LONG(1011, Severity.ERROR, "the query is longer than %d characters"),
    UNTERMINATED_COMMENT(1012, Severity.ERROR, "block comment is not terminated"),
    INTEGER_OVERFLOW(1013, Severity.ERROR, "integer literal '%s' does not fit in 64 bits"),
    FLOAT_OVERFLOW(1014, Severity.ERROR, "float literal '%s' is too large"),
    PATTERN_NOT_ALLOWED(1015, Severity.ERROR, "a pattern can only be a predicate here: use it in WHERE or inside exists(…), or write a pattern comprehension [%s | …]"),
    UNTERMINATED_NAME(1016, Severity.ERROR, "backtick-quoted name is not terminated"),
    TOO_COMPLEX(1017, Severity.ERROR, "the query chains too many operators to be read (a chain of about %d AND, OR or NOT is the most); split the condition, or use IN [...] for many alternatives"),

    // ---- TG2xxx scope and typing ----
    UNDEFINED_VARIABLE(2001, Severity.ERROR, "variable '%s' is not defined"),
    VARIABLE_TYPE_CONFLICT(2002, Severity.ERROR, "variable '%s' is bound as a %s and used as a %s"),
    VARIABLE_ALREADY_BOUND(2003, Severity.ERROR, "variable '%s' is already bound"),
    AGGREGATION_NOT_ALLOWED(2004, Severity.ERROR, "aggregation is not allowed in %s"),
    NESTED_AGGREGATION(2005, Severity.ERROR, "an aggregation cannot contain another aggregation"),
    ORDER_BY_DROPPED_VARIABLE(2006, Severity.ERROR, "ORDER BY refers to '%s', which is not projected after %s"),
    UNION_COLUMN_MISMATCH(2007, Severity.ERROR, "all parts of a UNION must return the same columns; found %s and %s"),
    RETURN_STAR_NO_VARIABLES(2008, Severity.ERROR, "RETURN * needs at least one variable in scope"),
    MISSING_ALIAS(2009, Severity.ERROR, "expression in WITH must be aliased (use AS)"),
    DUPLICATE_COLUMN(2010, Severity.ERROR, "column name '%s' is used more than once"),
    UNKNOWN_FUNCTION(2011, Severity.ERROR, "unknown function '%s'"),
    WRONG_ARGUMENT_COUNT(2012, Severity.ERROR, "function '%s' takes %s argument(s), given %d"),
    INVALID_ARGUMENT_TYPE(2013, Severity.ERROR, "%s"),
    NO_RETURN(2014, Severity.ERROR, "a read query must end with RETURN"),
    INVALID_CLAUSE_ORDER(2015, Severity.ERROR, "%s"),
    NEGATIVE_INTEGER(2016, Severity.ERROR, "%s must be a non-negative integer"),
    INVALID_DELETE(2017, Severity.ERROR, "%s"),
    NON_CONSTANT_EXPRESSION(2018, Severity.ERROR, "%s must be a constant; it refers to variable '%s'"),
    AMBIGUOUS_AGGREGATION(2019, Severity.ERROR, "'%s' is used beside an aggregation but is not a grouping key; project it on its own"),
    INVALID_PARAMETER_USE(2020, Severity.ERROR, "a parameter cannot stand for the property map of a pattern in MATCH"),
    MIXED_UNION(2021, Severity.ERROR, "UNION and UNION ALL cannot be mixed in one query"),
    NONDETERMINISTIC_AGGREGATE(2022, Severity.ERROR, "%s() gives a new value at every call and cannot be aggregated"),

    // ---- TG3xxx ontology terms ----
    UNKNOWN_LABEL(3001, Severity.ERROR, "label '%s' is not defined by the ontology"),
    UNKNOWN_RELATIONSHIP_TYPE(3002, Severity.ERROR, "relationship type '%s' is not defined by the ontology"),
    UNKNOWN_PROPERTY(3003, Severity.ERROR, "property key '%s' is not defined by the ontology"),
    PROPERTY_NOT_ON_LABEL(3004, Severity.ERROR, "property '%s' is not defined for %s"),
    WRONG_DIRECTION(3005, Severity.ERROR, "relationship '%s' goes from %s to %s in the ontology, not the other way"),
    ENDPOINTS_NOT_ALLOWED(3006, Severity.ERROR, "relationship '%s' cannot connect %s to %s"),
    UNSATISFIABLE_PATTERN(3007, Severity.ERROR, "no class can satisfy %s; the pattern always returns nothing"),
    LITERAL_TYPE_MISMATCH(3008, Severity.ERROR, "property '%s' holds %s values; compared with %s"),
    DEPRECATED_TERM(3009, Severity.WARNING, "%s '%s' is deprecated in the ontology"),
    IMPOSSIBLE_LABELS(3010, Severity.ERROR, "no node can carry both %s"),
    DID_YOU_MEAN(3099, Severity.INFO, "did you mean %s?"),

    // ---- TG4xxx read-only ----
    WRITE_CLAUSE(4001, Severity.ERROR, "%s changes data; only read queries are run"),
    PROCEDURE_CALL(4002, Severity.ERROR, "CALL %s runs a procedure; only read queries without procedures are run"),
    LOAD_CSV(4003, Severity.ERROR, "LOAD CSV reads outside data; only read queries over the graph are run"),
    SUBQUERY_CALL(4004, Severity.ERROR, "CALL { … } subqueries are not run; write the query without them"),
    MERGE_CLAUSE(4005, Severity.ERROR, "MERGE may create data; only read queries are run"),
    SET_CLAUSE(4006, Severity.ERROR, "SET changes data; only read queries are run"),
    REMOVE_CLAUSE(4007, Severity.ERROR, "REMOVE changes data; only read queries are run"),
    DELETE_CLAUSE(4008, Severity.ERROR, "%s deletes data; only read queries are run"),
    FOREACH_CLAUSE(4009, Severity.ERROR, "FOREACH runs updates; only read queries are run"),

    // ---- TG5xxx running ----
    TIMEOUT(5001, Severity.ERROR, "the query ran longer than %s and was stopped"),
    ROW_LIMIT(5002, Severity.WARNING, "result truncated at %d rows"),
    RUNTIME_ERROR(5003, Severity.ERROR, "%s"),
    REMOTE_UNAVAILABLE(5004, Severity.ERROR, "cannot reach the graph server at %s: %s"),
    CANCELLED(5005, Severity.ERROR, "the query was cancelled"),

    // ---- TG6xxx reading ontologies and data ----
    ONTOLOGY_SYNTAX(6001, Severity.ERROR, "%s"),
    ONTOLOGY_UNREADABLE(6002, Severity.ERROR, "cannot read %s: %s"),
    ONTOLOGY_EMPTY(6003, Severity.ERROR, "%s holds no classes or properties"),
    NAME_COLLISION(6004, Severity.WARNING,
            "%s and %s both map to the %s name '%s'; they are named %s (set tg:graphName on a term to choose its name)"),
    SUBCLASS_CYCLE(6005, Severity.WARNING, "classes %s form a subclass cycle; they are treated as equivalent"),
    PUNNED_TERM(6006, Severity.WARNING, "%s is declared both as a class and as a property"),
    UNSUPPORTED_DOMAIN(6007, Severity.WARNING, "%s has a %s that is not a class or a union of classes; it is treated as any class"),
    UNKNOWN_DATA_TERM(6008, Severity.WARNING, "%s is not defined by the ontology; %d statement(s) not imported"),
    IMPORT_NOT_LOADED(6009, Severity.WARNING, "%s imports %s, which is not among the sources given; it was not fetched"),
    DATA_KIND_MISMATCH(6011, Severity.WARNING, "%s is a %s, but %d statement(s) give it %s; they were not imported"),
    BAD_DATA_VALUE(6012, Severity.WARNING, "%d value(s) of %s are not valid %s (e.g. '%s'); they were kept as text"),
    MIXED_RANGE(6010, Severity.INFO, "%d propert(ies) have both literal and class ranges and are both a property key and a relationship type (e.g. %s)"),

    // ---- TG7xxx translation ----
    NO_QUERY_IN_REPLY(7001, Severity.ERROR, "the model's reply holds no query"),
    MODEL_FAILED(7002, Severity.ERROR, "the model service failed: %s"),
    NOT_UNDERSTOOD(7003, Severity.ERROR, "the question was not understood well enough to write a query (%s)"),
    ATTEMPTS_EXHAUSTED(7004, Severity.ERROR, "no valid query after %d attempt(s)");

    private final int number;
    private final Severity severity;
    private final String template;

    Code(int number, Severity severity, String template) {
        this.number = number;
        this.severity = severity;
        this.template = template;
    }

    /** The stable identifier, e.g. {@code TG3001}. */
    public String id() {
        return "TG" + number;
    }

    public int number() {
        return number;
    }

    public Severity severity() {
        return severity;
    }

    public String template() {
        return template;
    }

    public String format(Object... args) {
        return String.format(Locale.ROOT, template, args);
    }
}
