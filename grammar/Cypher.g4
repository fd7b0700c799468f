/*
 * termgate's grammar of the openCypher query language.
 *
 * Written for termgate from the openCypher 9 language reference and the openCypher Technology Compatibility Kit
 * (TCK 1.0.0-M23), plus ISO/IEC 39075 GQL label expressions (:A|B, :A&B, :!A, :%).
 *
 * Conventions: the entry rule ends in EOF; every alternative of a rule with several alternatives carries a label,
 * so the tree builder has one visitor method per form; keywords are case-insensitive (fragment letters, since the
 * ANTLR 4.9 runtime has no caseInsensitive option). Semantic checks that a grammar would express only clumsily
 * (clause order, where a pattern may stand as a predicate, escape validity, number ranges) are made by the tree
 * builder and the analyzer, which give precise messages.
 */
grammar Cypher;

// ============================================================ statements

statement
    : query endOfStatement EOF
    ;

/**
 * The optional semicolon sits in a rule of its own so that, when the text goes on after a complete query, the
 * error names every word that could have come next (ANTLR keeps the loop state that could still continue only
 * while the decision before EOF can exit its rule).
 */
endOfStatement
    : SEMI?
    ;

query
    : singleQuery unionPart*
    ;

unionPart
    : UNION ALL? singleQuery
    ;

singleQuery
    : clause+
    ;

clause
    : OPTIONAL? MATCH pattern whereClause?                                   # MatchClause
    | UNWIND expression AS variable                                          # UnwindClause
    | WITH projectionBody whereClause?                                       # WithClause
    | RETURN projectionBody                                                  # ReturnClause
    | CREATE pattern                                                         # CreateClause
    | MERGE patternPart mergeAction*                                         # MergeClause
    | SET setItem (COMMA setItem)*                                           # SetClause
    | REMOVE removeItem (COMMA removeItem)*                                  # RemoveClause
    | DETACH? DELETE expression (COMMA expression)*                          # DeleteClause
    | FOREACH LPAREN variable IN expression PIPE clause+ RPAREN              # ForeachClause
    | LOAD CSV (WITH HEADERS)? FROM expression AS variable
      (FIELDTERMINATOR StringLiteral)?                                       # LoadCsvClause
    | CALL LBRACE query RBRACE                                               # CallSubqueryClause
    | CALL procedureName (LPAREN (expression (COMMA expression)*)? RPAREN)?
      (YIELD yieldItems)?                                                    # CallProcedureClause
    ;

whereClause
    : WHERE expression
    ;

mergeAction
    : ON (MATCH | CREATE) SET setItem (COMMA setItem)*
    ;

setItem
    : propertyExpression EQ expression                                       # SetPropertyItem
    | variable EQ expression                                                 # SetVariableItem
    | variable PLUSEQ expression                                             # SetMergeItem
    | variable nodeLabels                                                    # SetLabelsItem
    ;

removeItem
    : variable nodeLabels                                                    # RemoveLabelsItem
    | propertyExpression                                                     # RemovePropertyItem
    ;

/** {@code n.a.b} or {@code (n).a}: an atom followed by at least one property key. */
propertyExpression
    : atom (DOT propertyKeyName)+
    ;

procedureName
    : (symbolicName DOT)* symbolicName
    ;

yieldItems
    : STAR whereClause?                                                      # YieldAll
    | yieldItem (COMMA yieldItem)* whereClause?                              # YieldList
    ;

yieldItem
    : schemaName (AS variable)?
    ;

// ============================================================ projections

projectionBody
    : DISTINCT? projectionItems orderBy? skip? limit?
    ;

projectionItems
    : STAR (COMMA projectionItem)*                                           # ProjectStar
    | projectionItem (COMMA projectionItem)*                                 # ProjectList
    ;

projectionItem
    : expression (AS variable)?
    ;

orderBy
    : ORDER BY sortItem (COMMA sortItem)*
    ;

skip
    : SKIP_ expression
    ;

limit
    : LIMIT expression
    ;

sortItem
    : expression (ASCENDING | ASC | DESCENDING | DESC)?
    ;

// ============================================================ patterns

pattern
    : patternPart (COMMA patternPart)*
    ;

patternPart
    : (variable EQ)? anonymousPatternPart
    ;

anonymousPatternPart
    : SHORTESTPATH LPAREN patternElement RPAREN                              # ShortestPathPart
    | ALLSHORTESTPATHS LPAREN patternElement RPAREN                          # AllShortestPathsPart
    | patternElement                                                         # PlainPart
    ;

patternElement
    : nodePattern patternElementChain*                                       # ChainElement
    | LPAREN patternElement RPAREN                                           # ParenthesizedElement
    ;

patternElementChain
    : relationshipPattern nodePattern
    ;

nodePattern
    : LPAREN variable? nodeLabels? properties? RPAREN
    ;

/** {@code :A:B} or a GQL label expression after a single colon. */
nodeLabels
    : (COLON labelExpression)+
    ;

labelExpression
    : BANG labelExpression                                                   # LabelNot
    | labelExpression AMP labelExpression                                    # LabelAnd
    | labelExpression PIPE COLON? labelExpression                            # LabelOr
    | LPAREN labelExpression RPAREN                                          # LabelParen
    | PERCENT                                                                # LabelAny
    | schemaName                                                             # LabelName
    ;

/**
 * Labels in an expression ({@code WHERE n:A}). A top-level {@code |} is left out here: in
 * {@code [x IN list WHERE x:A | x.name]} it would be ambiguous with the comprehension's bar; write {@code n:(A|B)}.
 */
labelPredicate
    : (COLON labelConjunction)+
    ;

labelConjunction
    : labelFactor (AMP labelFactor)*
    ;

labelFactor
    : BANG labelFactor                                                       # LabelFactorNot
    | LPAREN labelExpression RPAREN                                          # LabelFactorParen
    | PERCENT                                                                # LabelFactorAny
    | schemaName                                                             # LabelFactorName
    ;

/** One rule with optional arrow heads rather than four alternatives: the choice would need lookahead over the
 * whole bracket, properties included. */
relationshipPattern
    : left=LT? MINUS relationshipDetail? MINUS right=GT?
    ;

relationshipDetail
    : LBRACKET variable? relationshipTypes? rangeLiteral? properties? RBRACKET
    ;

relationshipTypes
    : COLON labelExpression
    ;

rangeLiteral
    : STAR integerLiteral? (DOTDOT integerLiteral?)?                         # StarRange
    | integerLiteral? DOTDOT integerLiteral?                                  # BareRange
    ;

properties
    : mapLiteral                                                             # MapProperties
    | parameter                                                              # ParameterProperties
    ;

// ============================================================ expressions
// Alternatives are listed from the tightest binding to the loosest (ANTLR's precedence climbing). The string,
// list and null predicates share one level in openCypher, read left to right: StringListExpr and the postfix
// IsNullExpr just after it give exactly that (a IN b IS NULL is (a IN b) IS NULL; a IS NULL IN b is (a IS NULL) IN b).

expression
    : atom                                                                   # AtomExpr
    | expression DOT propertyKeyName                                         # PropertyExpr
    | expression LBRACKET expression RBRACKET                                # SubscriptExpr
    | expression LBRACKET from=expression? DOTDOT to=expression? RBRACKET    # SliceExpr
    | expression labelPredicate                                              # LabelsExpr
    | (PLUS | MINUS) expression                                              # UnaryExpr
    | expression CARET expression                                            # PowerExpr
    | expression (STAR | SLASH | PERCENT) expression                         # MultiplyExpr
    | expression (PLUS | MINUS) expression                                   # AddExpr
    | expression (STARTS WITH | ENDS WITH | CONTAINS | IN | REGEX) expression # StringListExpr
    | expression IS NOT? NULL                                                # IsNullExpr
    | expression (EQ | NE | LT | GT | LE | GE) expression                    # ComparisonExpr
    | NOT expression                                                         # NotExpr
    | expression AND expression                                              # AndExpr
    | expression XOR expression                                              # XorExpr
    | expression OR expression                                               # OrExpr
    ;

/** Comprehensions come before list literals: {@code [x IN list]} is read as a comprehension (ANTLR takes the first
 * of two alternatives that both match). */
atom
    : LBRACKET variable IN expression (WHERE expression)? (PIPE expression)? RBRACKET
                                                                             # ListComprehensionAtom
    | LBRACKET (variable EQ)? relationshipsPattern (WHERE expression)? PIPE expression RBRACKET
                                                                             # PatternComprehensionAtom
    | literal                                                                # LiteralAtom
    | parameter                                                              # ParameterAtom
    | COUNT LPAREN STAR RPAREN                                               # CountStarAtom
    | CASE expression? caseAlternative+ (ELSE expression)? END               # CaseAtom
    | quantifier LPAREN variable IN expression (WHERE expression)? RPAREN    # QuantifierAtom
    | REDUCE LPAREN variable EQ expression COMMA variable IN expression PIPE expression RPAREN
                                                                             # ReduceAtom
    | EXISTS LBRACE subqueryBody RBRACE                                      # ExistsSubqueryAtom
    | COUNT LBRACE subqueryBody RBRACE                                       # CountSubqueryAtom
    | relationshipsPattern                                                   # PatternAtom
    | LPAREN expression RPAREN                                               # ParenAtom
    | functionName LPAREN DISTINCT? (expression (COMMA expression)*)? RPAREN # FunctionAtom
    | variable LBRACE (mapProjectionItem (COMMA mapProjectionItem)*)? RBRACE # MapProjectionAtom
    | variable                                                               # VariableAtom
    ;

subqueryBody
    : query                                                                  # FullSubquery
    | pattern whereClause?                                                   # PatternSubquery
    ;

caseAlternative
    : WHEN expression THEN expression
    ;

quantifier
    : ALL                                                                    # QuantAll
    | ANY                                                                    # QuantAny
    | NONE                                                                   # QuantNone
    | SINGLE                                                                 # QuantSingle
    ;

/** A path of at least one hop, used as a predicate or in a pattern comprehension. */
relationshipsPattern
    : nodePattern patternElementChain+
    ;

mapProjectionItem
    : DOT STAR                                                               # MapAllProperties
    | DOT propertyKeyName                                                    # MapPropertySelector
    | propertyKeyName COLON expression                                       # MapLiteralEntry
    | variable                                                               # MapVariableSelector
    ;

functionName
    : (symbolicName DOT)* functionNamePart
    ;

/** Function names include the keywords that are also built-in function names. */
functionNamePart
    : symbolicName                                                           # PlainFunctionName
    | EXISTS                                                                 # ExistsFunctionName
    ;

literal
    : numberLiteral                                                          # NumberLit
    | StringLiteral                                                          # StringLit
    | TRUE                                                                   # TrueLit
    | FALSE                                                                  # FalseLit
    | NULL                                                                   # NullLit
    | LBRACKET (expression (COMMA expression)*)? RBRACKET                    # ListLit
    | mapLiteral                                                             # MapLit
    ;

numberLiteral
    : integerLiteral                                                         # IntegerNumber
    | FloatLiteral                                                           # FloatNumber
    | InvalidNumber                                                          # BadNumber
    ;

integerLiteral
    : DecimalInteger                                                         # DecimalInt
    | HexInteger                                                             # HexInt
    | OctalInteger                                                           # OctalInt
    ;

mapLiteral
    : LBRACE (mapEntry (COMMA mapEntry)*)? RBRACE
    ;

mapEntry
    : propertyKeyName COLON expression
    ;

parameter
    : DOLLAR (symbolicName | DecimalInteger)
    ;

variable
    : symbolicName
    ;

propertyKeyName
    : schemaName
    ;

/** Labels, relationship types and property keys may be any name, reserved words included. */
schemaName
    : symbolicName                                                           # SymbolicSchemaName
    | reservedWord                                                           # ReservedSchemaName
    ;

symbolicName
    : Identifier                                                             # PlainName
    | EscapedName                                                            # EscapedSymbolicName
    | nonReservedWord                                                        # KeywordName
    ;

/** Keywords that may still serve as variable and function names (models write (call:Call), (order:Order)). */
nonReservedWord
    : COUNT | ANY | NONE | SINGLE | REDUCE | SHORTESTPATH | ALLSHORTESTPATHS | CSV | HEADERS | FIELDTERMINATOR
    | FROM | ASC | ASCENDING | DESC | DESCENDING | BY | YIELD | LOAD | STARTS | ENDS | CONTAINS | DETACH
    | FOREACH | ON | REMOVE | CALL | ORDER
    ;

reservedWord
    : ALL | AND | AS | CASE | CREATE | DELETE | DISTINCT | ELSE | END | EXISTS | FALSE | IN | IS
    | LIMIT | MATCH | MERGE | NOT | NULL | OPTIONAL | OR | RETURN | SET | SKIP_ | THEN | TRUE | UNION
    | UNWIND | WHEN | WHERE | WITH | XOR
    ;

// ============================================================ lexer

ALL : A L L ;
ALLSHORTESTPATHS : A L L S H O R T E S T P A T H S ;
AND : A N D ;
ANY : A N Y ;
AS : A S ;
ASC : A S C ;
ASCENDING : A S C E N D I N G ;
BY : B Y ;
CALL : C A L L ;
CASE : C A S E ;
CONTAINS : C O N T A I N S ;
COUNT : C O U N T ;
CREATE : C R E A T E ;
CSV : C S V ;
DELETE : D E L E T E ;
DESC : D E S C ;
DESCENDING : D E S C E N D I N G ;
DETACH : D E T A C H ;
DISTINCT : D I S T I N C T ;
ELSE : E L S E ;
END : E N D ;
ENDS : E N D S ;
EXISTS : E X I S T S ;
FALSE : F A L S E ;
FIELDTERMINATOR : F I E L D T E R M I N A T O R ;
FOREACH : F O R E A C H ;
FROM : F R O M ;
HEADERS : H E A D E R S ;
IN : I N ;
IS : I S ;
LIMIT : L I M I T ;
LOAD : L O A D ;
MATCH : M A T C H ;
MERGE : M E R G E ;
NONE : N O N E ;
NOT : N O T ;
NULL : N U L L ;
ON : O N ;
OPTIONAL : O P T I O N A L ;
OR : O R ;
ORDER : O R D E R ;
REDUCE : R E D U C E ;
REMOVE : R E M O V E ;
RETURN : R E T U R N ;
SET : S E T ;
SHORTESTPATH : S H O R T E S T P A T H ;
SINGLE : S I N G L E ;
SKIP_ : S K I P ;
STARTS : S T A R T S ;
THEN : T H E N ;
TRUE : T R U E ;
UNION : U N I O N ;
UNWIND : U N W I N D ;
WHEN : W H E N ;
WHERE : W H E R E ;
WITH : W I T H ;
XOR : X O R ;
YIELD : Y I E L D ;

// Numbers: valid forms first, so that on equal length they win over InvalidNumber.
HexInteger : '0' [xX] [0-9a-fA-F]+ ;
OctalInteger : '0' [oO] [0-7]+ ;
DecimalInteger : '0' | [1-9] Digit* ;
FloatLiteral
    : Digit+ '.' Digit+ Exponent?
    | '.' Digit+ Exponent?
    | Digit+ Exponent
    ;
/** A digit run glued to letters ({@code 0x}, {@code 12ab}, {@code 0x1G}): reported as an invalid number. */
InvalidNumber : Digit [0-9a-zA-Z_]* ;

StringLiteral
    : '"' (~["\\] | '\\' .)* '"'
    | '\'' (~['\\] | '\\' .)* '\''
    ;

EscapedName : '`' (~'`' | '``')* '`' ;

Identifier : IdentifierStart IdentifierPart* ;

DOLLAR : '$' ;
COMMA : ',' ;
SEMI : ';' ;
COLON : ':' ;
DOTDOT : '..' ;
DOT : '.' ;
LPAREN : '(' ;
RPAREN : ')' ;
LBRACKET : '[' ;
RBRACKET : ']' ;
LBRACE : '{' ;
RBRACE : '}' ;
PLUSEQ : '+=' ;
REGEX : '=~' ;
NE : '<>' | '!=' ;
LE : '<=' ;
GE : '>=' ;
EQ : '=' ;
LT : '<' ;
GT : '>' ;
PLUS : '+' ;
MINUS : '-' ;
STAR : '*' ;
SLASH : '/' ;
PERCENT : '%' ;
CARET : '^' ;
PIPE : '|' ;
AMP : '&' ;
BANG : '!' ;

// Blanks and comments are skipped rather than kept on a hidden channel: nothing reads them, and skipping halves
// the token stream.
WS : [ \t\n\r\u000B\u000C\u001C-\u001F\u00A0\u1680\u2000-\u200A\u2028\u2029\u202F\u205F\u3000\uFEFF]+ -> skip ;
LINE_COMMENT : '//' ~[\r\n]* -> skip ;
BLOCK_COMMENT : '/*' .*? '*/' -> skip ;

/** Any other character: kept as a token so the parser reports it with its position. */
UNKNOWN : . ;

fragment Digit : [0-9] ;
fragment Exponent : [eE] [+-]? Digit+ ;
fragment IdentifierStart : [\p{ID_Start}\p{Pc}] ;
fragment IdentifierPart : [\p{ID_Continue}\p{Sc}] ;

fragment A : [aA] ; fragment B : [bB] ; fragment C : [cC] ; fragment D : [dD] ; fragment E : [eE] ;
fragment F : [fF] ; fragment G : [gG] ; fragment H : [hH] ; fragment I : [iI] ; fragment J : [jJ] ;
fragment K : [kK] ; fragment L : [lL] ; fragment M : [mM] ; fragment N : [nN] ; fragment O : [oO] ;
fragment P : [pP] ; fragment Q : [qQ] ; fragment R : [rR] ; fragment S : [sS] ; fragment T : [tT] ;
fragment U : [uU] ; fragment V : [vV] ; fragment W : [wW] ; fragment X : [xX] ; fragment Y : [yY] ;
fragment Z : [zZ] ;
