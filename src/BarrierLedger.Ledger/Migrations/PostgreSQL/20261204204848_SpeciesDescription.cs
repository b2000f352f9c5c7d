using Microsoft.EntityFrameworkCore.Migrations;

#nullable disable

namespace BarrierLedger.Ledger.Migrations.PostgreSQL
{
    /// <inheritdoc />
    public partial class SpeciesDescription : Migration
    {
        /// <inheritdoc />
        protected override void Up(MigrationBuilder migrationBuilder)
        {
            migrationBuilder.AddColumn<string>(
                name: "Description",
                table: "Species",
                type: "character varying(4000)",
                maxLength: 4000,
                nullable: false,
                defaultValue: "",
                collation: "C");
        }

        /// <inheritdoc />
        protected override void Down(MigrationBuilder migrationBuilder)
        {
            migrationBuilder.DropColumn(
                name: "Description",
                table: "Species");
        }
    }
}
