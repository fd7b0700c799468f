package dev.termgate.cli;

import dev.termgate.card.BudgetTooSmallException;
import dev.termgate.card.Card;
import dev.termgate.card.CardJson;
import dev.termgate.card.CardTerm;
import dev.termgate.card.Cards;
import dev.termgate.card.DotCard;
import dev.termgate.card.Graphviz;
import dev.termgate.card.TokenCounter;
import dev.termgate.card.TokenEncoding;
import dev.termgate.link.LinkOptions;
import dev.termgate.link.Linkers;
import dev.termgate.link.Linking;
import dev.termgate.schema.GraphSchema;
import picocli.CommandLine.Command;
import picocli.CommandLine.ITypeConverter;
import picocli.CommandLine.Mixin;
import picocli.CommandLine.Model.CommandSpec;
import picocli.CommandLine.Option;
import picocli.CommandLine.Spec;
import picocli.CommandLine.TypeConversionException;

import java.io.IOException;
import java.io.PrintWriter;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.Arrays;
import java.util.Locale;
import java.util.Optional;
import java.util.concurrent.Callable;
import java.util.stream.Collectors;

/** {@code termgate card}: the schema card of the whole ontology, or of the part one question needs. */
@Command(name = "card",
        description = {
                "Print the schema card a model is given: every term of the ontology, or, with --question, the terms"
                        + " the question needs (ranked by schema linking, kept connected) within a token budget.",
                "The card's size in tokens is reported on standard error."},
        exitCodeListHeading = "%nExit codes:%n",
        exitCodeList = {
                "0:ok",
                "1:the ontology is invalid or unreadable",
                "2:usage error (also: a budget too small for any card, an unwritable --out file)",
                "3:an outside service or program failed (SPARQL endpoint, URL, Graphviz 'dot' missing or failing)",
                "4:internal error"})
public final class CardCommand implements Callable<Integer> {

    enum Format { TEXT, JSON, DOT, SVG }

    @Spec
    CommandSpec spec;

    @Mixin
    OntologyOptions ontology;

    @Option(names = "--question", paramLabel = "TEXT",
            description = "Make the card for this question only (terms ranked by schema linking).")
    String question;

    @Option(names = "--budget", paramLabel = "TOKENS",
            description = "Token budget of a question card (default ${DEFAULT-VALUE}). Without --question the whole"
                    + " card is printed and only compared with the budget.",
            defaultValue = "" + Cards.DEFAULT_BUDGET)
    int budget;

    @Option(names = "--encoding", paramLabel = "cl100k_base|o200k_base", converter = EncodingConverter.class,
            defaultValue = "cl100k_base", description = "Tokenizer used to count tokens (default ${DEFAULT-VALUE}).")
    TokenEncoding encoding;

    @Option(names = "--why", description = "After the card, show for each term the score and evidence that put it there"
            + " (needs --question; on standard error for the dot and svg formats).")
    boolean why;

    @Option(names = "--format", paramLabel = "text|json|dot|svg", converter = FormatConverter.class,
            defaultValue = "text",
            description = "text (default): the card; json: the card, its terms and the shown schema; dot: a Graphviz"
                    + " picture of the shown schema; svg: that picture drawn by Graphviz 'dot' (must be installed).")
    Format format;

    @Option(names = "--out", paramLabel = "FILE", description = "Write the output to FILE instead of standard output.")
    Path outFile;

    @Override
    public Integer call() {
        PrintWriter out = spec.commandLine().getOut();
        PrintWriter err = spec.commandLine().getErr();
        boolean forQuestion = question != null;
        if (forQuestion && question.isBlank()) throw new UserError(Exit.USAGE, "--question needs a non-empty text");
        if (budget < 1) throw new UserError(Exit.USAGE, "--budget must be a positive number of tokens, not " + budget);
        if (why && !forQuestion) throw new UserError(Exit.USAGE, "--why explains the terms chosen for a question; add --question");

        // Both take a few hundred milliseconds from a cold start; on two cores they overlap.
        TokenCounter.loadInBackground(encoding);
        GraphSchema schema = ontology.schema(err);
        Card card = forQuestion ? questionCard(schema) : Cards.whole(schema, encoding);

        String output = switch (format) {
            case TEXT -> card.text() + (why ? whyText(card) : "");
            case JSON -> CardJson.toJson(card, schema, Optional.ofNullable(question));
            case DOT -> DotCard.render(schema, card.scope());
            case SVG -> svg(DotCard.render(schema, card.scope()));
        };
        if (why && format != Format.TEXT && format != Format.JSON) err.print(whyText(card));
        write(output, out);
        report(card, schema, err, forQuestion);
        return Exit.OK;
    }

    private Card questionCard(GraphSchema schema) {
        Linking linking = link(schema);
        try {
            return Cards.forQuestion(schema, linking, budget, encoding);
        } catch (BudgetTooSmallException e) {
            throw new UserError(Exit.USAGE, e.getMessage());
        }
    }

    private Linking link(GraphSchema schema) {
        return Linkers.standard(schema, LinkOptions.defaults()).link(question, schema);
    }

    private static String svg(String dot) {
        try {
            return Graphviz.toSvg(dot);
        } catch (Graphviz.GraphvizException e) {
            throw new UserError(Exit.SERVICE, e.getMessage());
        }
    }

    private void write(String output, PrintWriter out) {
        if (outFile == null) {
            out.print(output);
            out.flush();
            return;
        }
        try {
            Files.writeString(outFile, output, StandardCharsets.UTF_8);
        } catch (IOException e) {
            throw new UserError(Exit.USAGE, "cannot write " + outFile + ": " + e.getMessage());
        }
    }

    private void report(Card card, GraphSchema schema, PrintWriter err, boolean forQuestion) {
        for (String n : card.notices()) err.println("termgate: note: " + n);
        StringBuilder sb = new StringBuilder("termgate: ");
        if (forQuestion) {
            sb.append("card for the question: ").append(card.terms().size()).append(" terms, ")
                    .append(card.tokens()).append(" of ").append(budget).append(" tokens (").append(encoding.id()).append(')');
            if (card.leftOut() > 0) sb.append(", ").append(card.leftOut()).append(" ranked terms left out");
        } else {
            sb.append("whole-ontology card: ").append(schema.labels().size()).append(" labels, ")
                    .append(schema.relTypes().size()).append(" relationship types, ")
                    .append(schema.properties().size()).append(" property keys; ")
                    .append(card.tokens()).append(" tokens (").append(encoding.id()).append(')');
            if (spec.commandLine().getParseResult().hasMatchedOption("--budget") && card.tokens() > budget) {
                sb.append("; over the budget of ").append(budget).append(" tokens: add --question to prune it");
            }
        }
        err.println(sb);
        err.flush();
    }

    /** One line per term: kind, name, score (or "-" when the card added it itself) and the evidence. */
    static String whyText(Card card) {
        StringBuilder sb = new StringBuilder("# why these terms (kind name score: evidence)\n");
        for (CardTerm t : card.terms()) {
            sb.append("# ").append(t.kind().name().toLowerCase(Locale.ROOT)).append(' ').append(t.name()).append(' ')
                    .append(t.score().isPresent() ? String.format(Locale.ROOT, "%.3f", t.score().getAsDouble()) : "-")
                    .append(": ").append(t.evidence().isEmpty() ? "-" : String.join("; ", t.evidence())).append('\n');
        }
        return sb.toString();
    }

    static final class EncodingConverter implements ITypeConverter<TokenEncoding> {
        @Override
        public TokenEncoding convert(String value) {
            return TokenEncoding.fromId(value).orElseThrow(() -> new TypeConversionException("'" + value
                    + "' is not a known encoding; use one of " + Arrays.stream(TokenEncoding.values())
                    .map(TokenEncoding::id).collect(Collectors.joining(", "))));
        }
    }

    static final class FormatConverter implements ITypeConverter<Format> {
        @Override
        public Format convert(String value) {
            try {
                return Format.valueOf(value.strip().toUpperCase(Locale.ROOT));
            } catch (IllegalArgumentException e) {
                throw new TypeConversionException("'" + value + "' is not a card format; use text, json, dot or svg");
            }
        }
    }
}
