package dev.termgate.parser;

import dev.termgate.diag.Code;
import dev.termgate.diag.Diagnostic;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.Arguments;
import org.junit.jupiter.params.provider.MethodSource;

import java.util.stream.Stream;

import static dev.termgate.diag.Code.*;
import static org.junit.jupiter.api.Assertions.assertAll;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;

/**
 * Malformed queries and the exact diagnostic each one gets: code, line, column (1-based) and message. The kinds of
 * fault follow the openCypher TCK's compile-time error details (UnexpectedSyntax, InvalidNumberLiteral,
 * InvalidUnicodeLiteral, InvalidUnicodeCharacter, InvalidRelationshipPattern, IntegerOverflow,
 * FloatingPointOverflow); the wording is termgate's own (common practice: say what was found and what could come).
 */
class SyntaxErrorTableTest {

    static Arguments row(String query, Code code, int line, int column, String message) {
        return Arguments.of(query, code, line, column, message);
    }

    static Stream<Arguments> table() {
        return Stream.of(
            row("", EMPTY_QUERY, 1, 1, "the query is empty"),
            row("   \n  ", EMPTY_QUERY, 1, 1, "the query is empty"),
            row("// only a comment", EMPTY_QUERY, 1, 1, "the query is empty"),
            row("/* block */", EMPTY_QUERY, 1, 1, "the query is empty"),
            row("MATCH (v:Vessel) RETRUN v", UNEXPECTED_INPUT, 1, 18, "unexpected 'RETRUN'; expected <clause>, 'UNION', 'WHERE', ',', '-', ';', '<' or end of input; did you mean 'RETURN'?"),
            row("MATHC (v) RETURN v", UNEXPECTED_INPUT, 1, 1, "unexpected 'MATHC'; expected <clause>; did you mean 'MATCH'?"),
            row("MATCH (v:Vessel RETURN v", UNEXPECTED_INPUT, 1, 17, "unexpected 'RETURN'; expected '$', '&', ')', ':', '{' or '|'"),
            row("MATCH (v)-[:CALLED_AT]->(p RETURN p", UNEXPECTED_INPUT, 1, 28, "unexpected 'RETURN'; expected '$', ')', ':' or '{'"),
            row("MATCH (v) WHERE RETURN v", UNEXPECTED_INPUT, 1, 17, "unexpected 'RETURN'; expected <expression>"),
            row("RETURN 1 +", UNEXPECTED_INPUT, 1, 11, "unexpected end of input; expected <expression>"),
            row("MATCH (v) RETURN v ORDER v.name", UNEXPECTED_INPUT, 1, 26, "unexpected 'v'; expected 'BY'"),
            row("MATCH (v) RETURN v LIMIT", UNEXPECTED_INPUT, 1, 25, "unexpected end of input; expected <expression>"),
            row("RETURN [1, 2", UNEXPECTED_INPUT, 1, 13, "unexpected end of input; expected ',', ']' or <operator>"),
            row("RETURN {name 'x'}", UNEXPECTED_INPUT, 1, 14, "unexpected string 'x'; expected ':'"),
            row("MATCH (v) RETURN v.", UNEXPECTED_INPUT, 1, 20, "unexpected end of input; expected <name>"),
            row("RETURN 'unterminated", UNTERMINATED_STRING, 1, 8, "string literal is not terminated"),
            row("RETURN \"also\nunterminated", UNTERMINATED_STRING, 1, 8, "string literal is not terminated"),
            row("MATCH (`v) RETURN 1", UNTERMINATED_NAME, 1, 8, "backtick-quoted name is not terminated"),
            row("RETURN 1 /* open comment", UNTERMINATED_COMMENT, 1, 10, "block comment is not terminated"),
            row("RETURN 0x", INVALID_NUMBER, 1, 8, "invalid number literal '0x'"),
            row("RETURN 12abc", INVALID_NUMBER, 1, 8, "invalid number literal '12abc'"),
            row("RETURN 9223372036854775808", INTEGER_OVERFLOW, 1, 8, "integer literal '9223372036854775808' does not fit in 64 bits"),
            row("RETURN 1.5e999", FLOAT_OVERFLOW, 1, 8, "float literal '1.5e999' is too large"),
            row("RETURN '\\uH'", INVALID_UNICODE_LITERAL, 1, 9, "invalid unicode escape '\\uH'"),
            row("RETURN 'a\\qb'", INVALID_ESCAPE, 1, 10, "invalid escape sequence '\\q' in string literal"),
            row("RETURN 42 \u2014 41", INVALID_CHARACTER, 1, 11, "character '\u2014' (U+2014) is not allowed here"),
            row("MATCH (a)-[:R..]->(b) RETURN b", INVALID_RELATIONSHIP_PATTERN, 1, 14, "invalid relationship pattern: a variable length needs '*', as in *1..3"),
            row("MATCH (n) RETURN (n)-->()", PATTERN_NOT_ALLOWED, 1, 18, "a pattern can only be a predicate here: use it in WHERE or inside exists(\u2026), or write a pattern comprehension [(\u2026)-->(\u2026) | \u2026]"),
            row("MATCH (n)\nWHERE n.name = 'x'\nRETURN n,", UNEXPECTED_INPUT, 3, 10, "unexpected end of input; expected <expression>"),
            row("MATCH (n) RETURN n; MATCH (m) RETURN m", UNEXPECTED_INPUT, 1, 21, "unexpected 'MATCH'; expected end of input"),
            row("CALL db.labels() YIELD * RETURN label", SYNTAX_ERROR, 1, 1, "YIELD * is allowed only when CALL is the whole query; name the fields to yield"),
            row("RETURN {, }", UNEXPECTED_INPUT, 1, 9, "unexpected ','; expected <name> or '}'"),
            row("RETURN [, ]", UNEXPECTED_INPUT, 1, 9, "unexpected ','; expected <expression> or ']'"),
            row("MATCH (n:) RETURN n", UNEXPECTED_INPUT, 1, 10, "unexpected ')'; expected <name>, '!', '%' or '('"),
            row("MATCH (n) RETURN DISTINCT", UNEXPECTED_INPUT, 1, 26, "unexpected end of input; expected <expression> or '*'"),
            row("UNWIND [1, 2] RETURN 1", UNEXPECTED_INPUT, 1, 15, "unexpected 'RETURN'; expected 'AS' or <operator>"),
            row("MATCH (n) WITH n AS RETURN n", UNEXPECTED_INPUT, 1, 21, "unexpected 'RETURN'; expected <name>"),
            row("RETURN CASE WHEN true THEN 1", UNEXPECTED_INPUT, 1, 29, "unexpected end of input; expected 'ELSE', 'END', 'WHEN' or <operator>"),
            row("MATCH (n) RETURN count(*", UNEXPECTED_INPUT, 1, 25, "unexpected end of input; expected ')'"),
            row("MATCH (n) RETURN n\nUNION\n", UNEXPECTED_INPUT, 3, 1, "unexpected end of input; expected <clause> or 'ALL'"),
            row("MATCH p = (a)-[*1..3]->(b) WHERE p RETURN", UNEXPECTED_INPUT, 1, 42, "unexpected end of input; expected <expression>, 'DISTINCT' or '*'"),
            row("RETURN x\u0000", INVALID_CHARACTER, 1, 9, "character U+0000 is not allowed here"));
    }

    @ParameterizedTest(name = "[{index}] {0}")
    @MethodSource("table")
    void reportsTheFirstFaultExactly(String query, Code code, int line, int column, String message) {
        ParseResult r = new CypherParser().parse(query);
        assertFalse(r.isValid(), "should not parse: " + query);
        Diagnostic d = r.diagnostics().get(0);
        assertAll(
                () -> assertEquals(code, d.code(), r.render()),
                () -> assertEquals(line, d.span().startLine(), r.render()),
                () -> assertEquals(column, d.span().startColumn(), r.render()),
                () -> assertEquals(message, d.fullMessage(), r.render()));
    }
}
