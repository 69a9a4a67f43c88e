-- "House bank" is the trade's other name for the house battery (the batteries that run the
-- boat's circuits, as against the engine's starting battery). A term an admin has already put in
-- a group keeps its group.
INSERT INTO search_synonyms (group_name, term) VALUES
  ('house battery', 'house battery'), ('house battery', 'house bank')
ON CONFLICT (term) DO NOTHING;
