package dev.termgate.link;

import dev.termgate.schema.Endpoint;
import dev.termgate.schema.GraphSchema;
import dev.termgate.schema.LangString;
import dev.termgate.schema.NodeLabel;
import dev.termgate.schema.PropertyKey;
import dev.termgate.schema.RelType;
import dev.termgate.schema.TermInfo;
import dev.termgate.schema.TermKind;
import dev.termgate.schema.ValueType;

import java.util.ArrayList;
import java.util.List;
import java.util.Optional;
import java.util.Set;

/** Builds small schemas by hand for unit tests (invented terms, "common practice" shapes). */
final class MiniSchema {
    private static final String NS = "https://example.org/mini#";

    private final List<NodeLabel> labels = new ArrayList<>();
    private final List<RelType> rels = new ArrayList<>();
    private final List<PropertyKey> keys = new ArrayList<>();
    private boolean withLabels = true;

    static MiniSchema create() {
        return new MiniSchema();
    }

    /** Terms get no rdfs:label and no comment: only their local names. */
    MiniSchema noAnnotations() {
        withLabels = false;
        return this;
    }

    MiniSchema label(String name, String comment, String... supers) {
        labels.add(new NodeLabel(info(TermKind.LABEL, name, comment, List.of()), Set.of(supers), Set.of()));
        return this;
    }

    MiniSchema labelWith(String name, List<LangString> ls, List<LangString> alts) {
        labels.add(new NodeLabel(new TermInfo(TermKind.LABEL, NS + name, name, ls, alts, List.of(), false),
                Set.of(), Set.of()));
        return this;
    }

    MiniSchema rel(String localName, String from, String to, String comment) {
        String name = dev.termgate.schema.Names.graphName(localName, TermKind.RELATIONSHIP, dev.termgate.schema.Names.Style.GRAPH);
        TermInfo i = info(TermKind.RELATIONSHIP, localName, comment, List.of());
        rels.add(new RelType(new TermInfo(i.kind(), i.iri(), name, i.labels(), i.altLabels(), i.comments(), false),
                List.of(new Endpoint(from, to)), Set.of(), Optional.empty(), false));
        return this;
    }

    MiniSchema key(String name, String domain, String comment) {
        keys.add(new PropertyKey(info(TermKind.PROPERTY, name, comment, List.of()),
                domain == null ? Set.of() : Set.of(domain), Optional.empty(), ValueType.STRING, Set.of()));
        return this;
    }

    private TermInfo info(TermKind kind, String localName, String comment, List<LangString> alts) {
        List<LangString> ls = withLabels
                ? List.of(new LangString(String.join(" ", dev.termgate.schema.Names.words(localName)), "en"))
                : List.of();
        List<LangString> cs = withLabels && comment != null ? List.of(new LangString(comment, "en")) : List.of();
        return new TermInfo(kind, NS + localName, localName, ls, alts, cs, false);
    }

    GraphSchema build(String hash) {
        return GraphSchema.of(hash, labels, rels, keys, List.of());
    }

    /** A small invented logistics schema used by several tests. */
    static GraphSchema logistics() {
        return create()
                .label("Thing", "Anything.")
                .label("Vessel", "A ship that carries cargo.", "Thing")
                .label("Tanker", "A vessel built to carry liquids in bulk.", "Vessel")
                .label("Voyage", "One journey of a vessel.", "Thing")
                .label("Port", "A harbour where vessels call.", "Thing")
                .label("Company", "A business organisation.", "Thing")
                .label("Country", "A sovereign state.", "Thing")
                .rel("performedBy", "Voyage", "Vessel", "The vessel that sails the voyage.")
                .rel("callsAt", "Voyage", "Port", "A port the voyage calls at.")
                .rel("operatedBy", "Vessel", "Company", "The company that operates the vessel.")
                .rel("inCountry", "Port", "Country", "The country the port is in.")
                .key("name", "Thing", "The name.")
                .key("deadweight", "Vessel", "Carrying capacity in tonnes.")
                .key("departureDate", "Voyage", "When the voyage started.")
                .build("mini-logistics");
    }
}
