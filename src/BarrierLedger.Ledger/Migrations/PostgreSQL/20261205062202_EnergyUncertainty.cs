using Microsoft.EntityFrameworkCore.Migrations;

#nullable disable

namespace BarrierLedger.Ledger.Migrations.PostgreSQL
{
    /// <inheritdoc />
    public partial class EnergyUncertainty : Migration
    {
        /// <inheritdoc />
        protected override void Up(MigrationBuilder migrationBuilder)
        {
            migrationBuilder.AddColumn<string>(
                name: "UncertaintyByLevel",
                table: "EnergyModels",
                type: "text",
                nullable: false,
                defaultValue: "",
                collation: "C");

            migrationBuilder.AddColumn<double>(
                name: "UncertaintyKcalPerMol",
                table: "EnergyModels",
                type: "double precision",
                nullable: true);
        }

        /// <inheritdoc />
        protected override void Down(MigrationBuilder migrationBuilder)
        {
            migrationBuilder.DropColumn(
                name: "UncertaintyByLevel",
                table: "EnergyModels");

            migrationBuilder.DropColumn(
                name: "UncertaintyKcalPerMol",
                table: "EnergyModels");
        }
    }
}
