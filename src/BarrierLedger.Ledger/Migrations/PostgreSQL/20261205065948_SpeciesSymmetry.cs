using Microsoft.EntityFrameworkCore.Migrations;

#nullable disable

namespace BarrierLedger.Ledger.Migrations.PostgreSQL
{
    /// <inheritdoc />
    public partial class SpeciesSymmetry : Migration
    {
        /// <inheritdoc />
        protected override void Up(MigrationBuilder migrationBuilder)
        {
            migrationBuilder.AddColumn<int>(
                name: "DetectedSymmetryNumber",
                table: "Species",
                type: "integer",
                nullable: true);

            migrationBuilder.AddColumn<string>(
                name: "PointGroup",
                table: "Species",
                type: "character varying(20)",
                maxLength: 20,
                nullable: false,
                defaultValue: "",
                collation: "C");

            migrationBuilder.AddColumn<int>(
                name: "SymmetryCalculationId",
                table: "Species",
                type: "integer",
                nullable: true);

            migrationBuilder.AddColumn<string>(
                name: "SymmetryNote",
                table: "Species",
                type: "character varying(1000)",
                maxLength: 1000,
                nullable: false,
                defaultValue: "",
                collation: "C");

            migrationBuilder.AddColumn<int>(
                name: "SymmetryNumberOverride",
                table: "Species",
                type: "integer",
                nullable: true);

            // A σ set before detection existed was set by a person: keep it as the override, so detection does not replace it.
            migrationBuilder.Sql("UPDATE \"Species\" SET \"SymmetryNumberOverride\" = \"SymmetryNumber\" WHERE \"SymmetryNumber\" <> 1");
        }

        /// <inheritdoc />
        protected override void Down(MigrationBuilder migrationBuilder)
        {
            migrationBuilder.DropColumn(
                name: "DetectedSymmetryNumber",
                table: "Species");

            migrationBuilder.DropColumn(
                name: "PointGroup",
                table: "Species");

            migrationBuilder.DropColumn(
                name: "SymmetryCalculationId",
                table: "Species");

            migrationBuilder.DropColumn(
                name: "SymmetryNote",
                table: "Species");

            migrationBuilder.DropColumn(
                name: "SymmetryNumberOverride",
                table: "Species");
        }
    }
}
