package dev.termgate.card;

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
import java.util.Collections;
import java.util.List;
import java.util.Optional;
import java.util.Random;
import java.util.Set;

/** Small schemas built by hand, with every feature the card renders (our own invented test data). */
final class TestSchemas {

    static final String NS = "https://example.org/harbour#";

    private TestSchemas() {}

    static GraphSchema harbour() {
        return harbour(null);
    }

    /** The same schema with its terms (and their annotation lists) given in a shuffled order. */
    static GraphSchema harbour(Random shuffle) {
        List<NodeLabel> labels = new ArrayList<>(List.of(
                label("Asset", Set.of(), List.of(), "Something of value that is owned. It may be sold."),
                label("Vessel", Set.of("Asset"), List.of("ship", "boat", "Vessel"),
                        "A craft able to carry cargo or people over water, self-propelled or towed by another craft of any kind."),
                label("Tanker", Set.of("Vessel"), List.of("oil tanker"), "A vessel for liquid cargo."),
                label("Barge", Set.of("Vessel"), List.of(), null),
                label("Organisation", Set.of(), List.of("organization", "body"), "A company, authority or association."),
                label("Company", Set.of("Organisation"), List.of("firm"), null),
                label("Port", Set.of(), List.of("harbour", "harbor"), "A place where vessels load and unload."),
                label("Country", Set.of(), List.of("nation", "state"), null),
                deprecated(label("Wharf", Set.of(), List.of(), "Old name of a berth. Use Port."))));
        List<RelType> rels = new ArrayList<>(List.of(
                rel("OPERATED_BY", List.of(new Endpoint("Vessel", "Company"), new Endpoint("Barge", "Organisation")),
                        Set.of(), "OPERATES", false, List.of("run by"), "Who runs the vessel day to day."),
                rel("OPERATES", List.of(), Set.of(), "OPERATED_BY", false, List.of(), null),
                rel("FLAGGED_IN", List.of(new Endpoint("Vessel", "Country")), Set.of(), null, false, List.of("flag state"), null),
                rel("NEAR", List.of(new Endpoint("Port", "Port")), Set.of(), null, true, List.of(), null),
                rel("CALLS_AT", List.of(new Endpoint("Vessel", "Port")), Set.of(), null, false, List.of("visits"), null),
                rel("BUNKERS_AT", List.of(), Set.of("CALLS_AT"), null, false, List.of(), "Takes on fuel at a port."),
                rel("LOCATED_IN", List.of(new Endpoint("Port", "Country"), new Endpoint("Company", "Country"),
                        new Endpoint("Organisation", "Country")), Set.of(), null, false, List.of(), null),
                rel("RELATED_TO", List.of(new Endpoint(null, null)), Set.of(), null, false, List.of(), null),
                rel("REGISTERED_AT", List.of(new Endpoint(null, "Port")), Set.of(), null, false, List.of(), null)));
        List<PropertyKey> keys = new ArrayList<>(List.of(
                key("name", Set.of(), ValueType.STRING, List.of("title")),
                key("imoNumber", Set.of("Vessel"), ValueType.STRING, List.of("IMO number")),
                key("builtOn", Set.of("Vessel"), ValueType.DATE, List.of("build date")),
                key("grossTonnage", Set.of("Vessel"), ValueType.INTEGER, List.of()),
                key("capacityCubicMetres", Set.of("Tanker"), ValueType.FLOAT, List.of()),
                key("purchasedOn", Set.of("Asset"), ValueType.DATE, List.of()),
                key("unlocode", Set.of("Port"), ValueType.STRING, List.of("UN/LOCODE", "port code")),
                key("isoCode", Set.of("Country"), ValueType.STRING, List.of()),
                key("foundedOn", Set.of("Organisation"), ValueType.DATE, List.of()),
                key("listed", Set.of("Company"), ValueType.BOOLEAN, List.of()),
                key("berthCount", Set.of("Port", "Wharf"), ValueType.INTEGER, List.of()),
                deprecatedKey(key("dwt", Set.of("Vessel"), ValueType.INTEGER, List.of("deadweight")))));
        if (shuffle != null) {
            Collections.shuffle(labels, shuffle);
            Collections.shuffle(rels, shuffle);
            Collections.shuffle(keys, shuffle);
            labels = labels.stream().map(l -> new NodeLabel(shuffled(l.info(), shuffle), l.superLabels(), l.equivalents())).toList();
        }
        return GraphSchema.of("test", labels, rels, keys, List.of());
    }

    static TermInfo info(TermKind kind, String name, List<String> alt, String comment) {
        return new TermInfo(kind, NS + name, name, List.of(new LangString(name.toLowerCase(), "en")),
                alt.stream().map(a -> new LangString(a, "en")).toList(),
                comment == null ? List.of() : List.of(new LangString(comment, "en"), new LangString("Ein Kommentar.", "de")),
                false);
    }

    static NodeLabel label(String name, Set<String> parents, List<String> alt, String comment) {
        return new NodeLabel(info(TermKind.LABEL, name, alt, comment), parents, Set.of());
    }

    static NodeLabel deprecated(NodeLabel l) {
        TermInfo i = l.info();
        return new NodeLabel(new TermInfo(i.kind(), i.iri(), i.name(), i.labels(), i.altLabels(), i.comments(), true),
                l.superLabels(), l.equivalents());
    }

    static RelType rel(String name, List<Endpoint> eps, Set<String> supers, String inverse, boolean symmetric,
                       List<String> alt, String comment) {
        return new RelType(info(TermKind.RELATIONSHIP, name, alt, comment), eps, supers, Optional.ofNullable(inverse), symmetric);
    }

    static PropertyKey key(String name, Set<String> domains, ValueType type, List<String> alt) {
        return new PropertyKey(info(TermKind.PROPERTY, name, alt, null), domains, Optional.empty(), type, Set.of());
    }

    static PropertyKey deprecatedKey(PropertyKey k) {
        TermInfo i = k.info();
        return new PropertyKey(new TermInfo(i.kind(), i.iri(), i.name(), i.labels(), i.altLabels(), i.comments(), true),
                k.domains(), k.datatype(), k.valueType(), k.superKeys());
    }

    private static TermInfo shuffled(TermInfo i, Random r) {
        List<LangString> alt = new ArrayList<>(i.altLabels());
        List<LangString> comments = new ArrayList<>(i.comments());
        Collections.shuffle(alt, r);
        Collections.shuffle(comments, r);
        return new TermInfo(i.kind(), i.iri(), i.name(), i.labels(), alt, comments, i.deprecated());
    }
}
