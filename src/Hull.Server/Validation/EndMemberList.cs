using Hull.Core.Chemistry;
using Hull.Core.Thermo;
using Hull.Protos.V1;
using Hull.Server.Caching;
using Hull.Server.Errors;

namespace Hull.Server.Validation;

/// <summary>Reads the end-members of a request (formulas or stored entry ids) into an end-member basis.</summary>
public static class EndMemberList
{
    /// <summary>The basis, or null when the request names no end-members.</summary>
    /// <exception cref="Grpc.Core.RpcException">INVALID_ARGUMENT naming the bad end-member (field
    /// "<paramref name="field"/>[i]"); NOT_FOUND for an entry id the version does not have.</exception>
    public static EndMemberBasis? Read(IReadOnlyList<EndMember> endMembers, VersionSnapshot snapshot, string field)
    {
        if (endMembers.Count == 0) return null;
        if (endMembers.Count < 2)
        {
            throw RpcErrors.InvalidArgument(field, "one end-member makes no hull; give 2 or more, or none for the hull over elements");
        }

        var compositions = new Composition[endMembers.Count];
        var violations = new List<FieldViolation>();
        for (int i = 0; i < endMembers.Count; i++)
        {
            string at = $"{field}[{i}]";
            EndMember member = endMembers[i];
            switch (member.SourceCase)
            {
                case EndMember.SourceOneofCase.Formula:
                    if (Composition.TryParse(member.Formula, out Composition? parsed, out FormulaParseException? error))
                    {
                        compositions[i] = parsed;
                    }
                    else
                    {
                        violations.Add(new($"{at}.formula", error.Message));
                    }

                    break;
                case EndMember.SourceOneofCase.EntryId:
                    if (!snapshot.TryFind(member.EntryId, out int row))
                    {
                        throw RpcErrors.EntryNotFound(snapshot.Version.Dataset, snapshot.Version.Version, member.EntryId,
                            $"end-member entry '{member.EntryId}' is not in dataset '{snapshot.Version.Dataset}' version {snapshot.Version.Version}",
                            $"{at}.entry_id");
                    }

                    compositions[i] = snapshot.Entries[row].Composition;
                    break;
                default:
                    violations.Add(new(at, "the end-member is empty; give its formula or the id of a stored entry"));
                    break;
            }
        }

        if (violations.Count > 0)
        {
            throw RpcErrors.InvalidArgument(BatchValidation.Summarize("the end-members were refused", violations), violations);
        }

        try
        {
            return new EndMemberBasis(compositions);
        }
        catch (ThermoInputException e)
        {
            string where = e.RowIndex is int j ? $"{field}[{j}]" : field;
            throw RpcErrors.InvalidArgument(where, e.Message);
        }
    }
}
