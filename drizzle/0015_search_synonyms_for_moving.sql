-- Owners write that they "moved", "relocated" or "repositioned" a battery or a tank; a new owner
-- types any of them. One group of the class's vocabulary (0008_search_vocabulary: the rules are
-- refreshed by the table's trigger). A term an admin has already put in a group keeps its group.
INSERT INTO search_synonyms (group_name, term) VALUES
  ('move', 'move'), ('move', 'relocate'), ('move', 'reposition')
ON CONFLICT (term) DO NOTHING;
